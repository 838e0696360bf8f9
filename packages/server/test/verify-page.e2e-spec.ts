import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import { useTestApp } from './support/test-app';

const PAGE = join(__dirname, '..', '..', 'verify', 'dist', 'verify.html');

describe('the offline verifier page', () => {
  const t = useTestApp();

  it('is served at /verify to anyone, as the one built file, under a policy that allows no connection', async () => {
    const res = await request(t.app.getHttpServer()).get('/verify').expect(200);
    expect(res.headers['content-type']).toBe('text/html; charset=utf-8');
    expect(res.headers['content-disposition']).toBeUndefined();
    const html = readFileSync(PAGE, 'utf8');
    expect(res.text).toBe(html);
    const policy = res.headers['content-security-policy'] as string;
    expect(policy).toContain("default-src 'none'");
    expect(policy).toContain("connect-src 'none'");
    expect(policy).toContain("frame-ancestors 'none'");
    // A hash source is the base64 SHA-256 of the element's text (CSP Level 3, §2.3.1 hash-source;
    // SHA-256 from node:crypto, FIPS 180-4): the inline script and style are the only ones allowed.
    const hash = (re: RegExp) =>
      `'sha256-${createHash('sha256').update(re.exec(html)![1]!, 'utf8').digest('base64')}'`;
    expect(policy).toContain(`script-src ${hash(/<script>([\s\S]*?)<\/script>/)}`);
    expect(policy).toContain(`style-src ${hash(/<style>([\s\S]*?)<\/style>/)}`);
    expect(html.match(/<script/g)).toHaveLength(1);
    expect(html).not.toMatch(/\b(src|href)="(https?:)?\/\//);
  });

  it('downloads as a file to keep', async () => {
    const res = await request(t.app.getHttpServer()).get('/verify/download').expect(200);
    expect(res.headers['content-disposition']).toBe('attachment; filename="beadroll-verify.html"');
    expect(res.text).toBe(readFileSync(PAGE, 'utf8'));
  });
});
