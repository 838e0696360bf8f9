// Helpers for exhibit tests over HTTP: uploads, raw bytes, and what is left on disk.
import { createHash } from 'node:crypto';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Agent, Test } from 'supertest';
import type { TestApp } from './test-app';

/** SHA-256 (hex) of bytes, as anyone re-hashing a download would compute it (FIPS 180-4). */
export function sha256(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** Every file under `dir`, recursively (none when it does not exist). */
export function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile())
    .map((e) => join(e.parentPath, e.name));
}

/** Stored blobs of the file-system store (its own `tmp` folder left out). */
export function storedBlobs(t: TestApp): string[] {
  const root = join(t.dataDir, 'exhibits');
  return filesUnder(root).filter((p) => !p.startsWith(join(root, 'tmp')));
}

/** Files left in the upload and processing folders (there should never be any between requests). */
export function leftovers(t: TestApp): string[] {
  return [
    ...filesUnder(join(t.dataDir, 'tmp', 'uploads')),
    ...filesUnder(join(t.dataDir, 'tmp', 'exhibit-work')),
    ...filesUnder(join(t.dataDir, 'exhibits', 'tmp')),
  ];
}

export interface UploadFields {
  kind?: string;
  caption?: string;
  sealed?: string;
  [extra: string]: string | undefined;
}

/** Posts one file as an exhibit, the way the web client does (multipart/form-data, CSRF header). */
export function upload(
  agent: Agent,
  code: string,
  bytes: Buffer | string,
  fields: UploadFields = { kind: 'close-up' },
  filename = 'photo.jpg',
  contentType = 'image/jpeg',
): Test {
  let req = agent.post(`/api/lots/${code}/exhibits`).set('X-Beadroll-Request', '1');
  for (const [k, v] of Object.entries(fields)) if (v !== undefined) req = req.field(k, v);
  return req.attach('file', Buffer.from(bytes), { filename, contentType });
}

/** A supertest parser that collects a response body as bytes, whatever its type. */
export const binary = ((res: NodeJS.ReadableStream, done: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
  res.on('error', (e: Error) => done(e, Buffer.alloc(0)));
}) as unknown as Parameters<Test['parse']>[0];

/** The entries of a roll as the signed-in viewer gets them. */
export async function rollOf(
  agent: Agent,
  code: string,
): Promise<
  Array<{ seq: number; kind: string; body: string; sealed?: Array<{ name: string; value: unknown }> }>
> {
  const res = await agent.get(`/api/lots/${code}/roll`).expect(200);
  return (res.body as { entries: [] }).entries;
}
