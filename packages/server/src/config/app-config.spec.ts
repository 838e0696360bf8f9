import { ConfigError, loadConfig } from './app-config';

describe('loadConfig', () => {
  it('uses the documented defaults', () => {
    const config = loadConfig({});
    expect(config.port).toBe(3000);
    expect(config.db.port).toBe(55432);
    expect(config.publicBaseUrl).toBe('http://127.0.0.1:3000');
  });

  it.each([
    ['PORT', 'abc'],
    ['PORT', '70000'],
    ['PGPORT', '-1'],
    ['DEMO_MODE', 'maybe'],
    ['PUBLIC_BASE_URL', 'ftp://x'],
    ['STORAGE_DRIVER', 'tape'],
    ['EXHIBIT_MAX_BYTES', '20MB'],
    ['S3_ENDPOINT', 'not a url'],
  ])('stops on a bad %s (%s) naming the variable', (name, value) => {
    expect(() => loadConfig({ [name]: value })).toThrow(ConfigError);
    expect(() => loadConfig({ [name]: value })).toThrow(new RegExp(name));
  });

  it('needs a bucket for the S3 exhibit store', () => {
    expect(() => loadConfig({ STORAGE_DRIVER: 's3' })).toThrow(/S3_BUCKET/);
    expect(loadConfig({ STORAGE_DRIVER: 's3', S3_BUCKET: 'b' }).storage.driver).toBe('s3');
    expect(loadConfig({}).exhibits.maxFileBytes).toBe(20 * 1024 * 1024);
  });
});
