import request from 'supertest';
import { buildOpenApiDocument } from '../src/openapi/openapi-document';
import { useTestApp } from './support/test-app';

describe('health and the API surface', () => {
  const t = useTestApp();

  it('reports the database as ok', async () => {
    const res = await request(t.app.getHttpServer()).get('/api/health').expect(200);
    expect(res.body).toMatchObject({
      status: 'ok',
      database: 'ok',
      migrations: 'up to date',
      log: 'ok',
      reasons: [],
    });
  });

  it('serves the OpenAPI document', async () => {
    const res = await request(t.app.getHttpServer()).get('/api/docs-json').expect(200);
    expect(res.body.openapi).toMatch(/^3\./);
    expect(Object.keys(res.body.paths)).toContain('/api/health');
  });

  it('serves the same document that is built from the module graph alone, without a database', async () => {
    const served = await request(t.app.getHttpServer()).get('/api/docs-json').expect(200);
    expect(served.body).toEqual(await buildOpenApiDocument());
  });

  it('describes one dealer card, named wherever a dealer is shown, and money as one shape', async () => {
    const { components, paths } = (await request(t.app.getHttpServer()).get('/api/docs-json')).body as {
      components: { schemas: Record<string, { properties?: Record<string, unknown> }> };
      paths: Record<string, Record<string, { responses: Record<string, unknown> }>>;
    };
    expect(Object.keys(components.schemas.DealerCard!.properties!).sort()).toEqual(
      [
        'business',
        'country',
        'displayName',
        'handle',
        'id',
        'role',
        'status',
        'town',
        'verifiedSince',
      ].sort(),
    );
    const names = Object.keys(components.schemas);
    expect(names.filter((n) => /Card|Party/.test(n)).sort()).toEqual([
      'DealerCard',
      'DealerCardsResponse',
      'PartyCard',
      'PartyName',
    ]);
    expect(names.filter((n) => /Money/.test(n))).toEqual(['MoneyDto']);
    expect(names).not.toContain('Object');
    expect(JSON.stringify(paths['/api/public/dealers/{handle}']!.get!.responses['200'])).toContain(
      '#/components/schemas/DealerCard',
    );
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
