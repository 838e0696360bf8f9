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
  ])('stops on a bad %s (%s) naming the variable', (name, value) => {
    expect(() => loadConfig({ [name]: value })).toThrow(ConfigError);
    expect(() => loadConfig({ [name]: value })).toThrow(new RegExp(name));
  });
});
