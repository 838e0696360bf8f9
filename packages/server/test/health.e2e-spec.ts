import request from 'supertest';
import { useTestApp } from './support/test-app';

describe('health and the API surface', () => {
  const t = useTestApp();

  it('reports the database as ok', async () => {
    const res = await request(t.app.getHttpServer()).get('/api/health').expect(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'ok', migrations: 'up to date' });
  });

  it('serves the OpenAPI document', async () => {
    const res = await request(t.app.getHttpServer()).get('/api/docs-json').expect(200);
    expect(res.body.openapi).toMatch(/^3\./);
    expect(Object.keys(res.body.paths)).toContain('/api/health');
  });

  it('answers unknown API routes with the stable error body', async () => {
    const res = await request(t.app.getHttpServer()).get('/api/no-such-thing').expect(404);
    expect(res.body.error).toMatchObject({ code: 'not_found' });
    expect(typeof res.body.error.requestId).toBe('string');
  });

  it('sends security headers', async () => {
    const res = await request(t.app.getHttpServer()).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
