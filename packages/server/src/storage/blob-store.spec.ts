import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { readdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { CreateBucketCommand } from '@aws-sdk/client-s3';
import S3rver from 's3rver';
import { BlobNotFoundError, type BlobStore } from './blob-store';
import { FsBlobStore } from './fs-blob-store';
import { S3BlobStore } from './s3-blob-store';

async function readAll(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}

// FIPS 180-2 example: SHA-256("abc").
const ABC_SHA256 = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';

function contract(name: string, setup: () => Promise<{ store: BlobStore; count: () => Promise<number> }>) {
  describe(name, () => {
    let store: BlobStore;
    let count: () => Promise<number>;
    let dir: string;
    beforeAll(async () => {
      ({ store, count } = await setup());
      dir = mkdtempSync(join(tmpdir(), 'blob-src-'));
    });
    afterAll(() => rmSync(dir, { recursive: true, force: true }));

    it('names a blob by the SHA-256 of its bytes (FIPS 180-2 "abc" example)', async () => {
      const res = await store.put({ stream: Readable.from([Buffer.from('a'), Buffer.from('bc')]) });
      expect(res).toEqual({ sha256: ABC_SHA256, size: 3, created: true });
      expect(await store.exists(ABC_SHA256)).toBe(true);
      expect((await readAll(await store.get(ABC_SHA256))).toString()).toBe('abc');
    });

    it('stores a file put twice once', async () => {
      const bytes = Buffer.alloc(300_000, 7);
      const file = join(dir, 'same.bin');
      writeFileSync(file, bytes);
      const before = await count();
      const first = await store.put({ path: file });
      const second = await store.put({ path: file });
      const third = await store.put({ stream: Readable.from([bytes]) });
      expect(first.created).toBe(true);
      expect(second).toEqual({ ...first, created: false });
      expect(third.created).toBe(false);
      expect(first.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
      expect(await count()).toBe(before + 1);
      expect((await readAll(await store.get(first.sha256))).equals(bytes)).toBe(true);
    });

    it('deletes, and reports an absent blob', async () => {
      const { sha256 } = await store.put({ stream: Readable.from([Buffer.from('to be removed')]) });
      await store.delete(sha256);
      expect(await store.exists(sha256)).toBe(false);
      await expect(store.get(sha256)).rejects.toBeInstanceOf(BlobNotFoundError);
      await expect(store.delete(sha256)).resolves.toBeUndefined();
    });

    it('refuses a name that is not a SHA-256', async () => {
      await expect(store.get('../../etc/passwd')).rejects.toThrow(/64 lower-case hex/);
    });
  });
}

async function countFiles(root: string, pattern: RegExp): Promise<number> {
  const entries = await readdir(root, { recursive: true, withFileTypes: true }).catch(() => []);
  return entries.filter((e) => e.isFile() && pattern.test(e.name)).length;
}

const cleanups: Array<() => Promise<void>> = [];
afterAll(async () => {
  for (const c of cleanups) await c();
});

contract('file-system blob store', async () => {
  const root = mkdtempSync(join(tmpdir(), 'blobs-fs-'));
  cleanups.push(async () => rmSync(root, { recursive: true, force: true }));
  return { store: new FsBlobStore(root), count: () => countFiles(root, /^[0-9a-f]{64}$/) };
});

contract('S3 blob store (against s3rver on 127.0.0.1)', async () => {
  const dir = mkdtempSync(join(tmpdir(), 'blobs-s3-'));
  const server = new S3rver({ port: 0, address: '127.0.0.1', silent: true, directory: dir });
  const { port } = (await server.run()) as { port: number };
  const store = new S3BlobStore({
    bucket: 'beadroll-test',
    endpoint: `http://127.0.0.1:${port}`,
    region: 'us-east-1',
    accessKeyId: 'S3RVER',
    secretAccessKey: 'S3RVER',
    forcePathStyle: true,
    spoolDir: join(dir, 'spool'),
  });
  await store.client.send(new CreateBucketCommand({ Bucket: 'beadroll-test' }));
  cleanups.push(async () => {
    store.client.destroy();
    await server.close();
    rmSync(dir, { recursive: true, force: true });
  });
  return { store, count: () => countFiles(join(dir, 'beadroll-test'), /^[0-9a-f]{64}\._S3rver_object$/) };
});
