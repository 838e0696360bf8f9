import { createHash, randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { readdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { CreateBucketCommand, ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { verifyRoll } from '@beadroll/core';
import S3rver from 's3rver';
import { LedgerService } from '../src/ledger/ledger.service';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { LotsService } from '../src/lots/lots.service';
import { BlockedDigestsService } from '../src/registry/blocked-digests.service';
import { BLOB_STORE, type BlobStore } from '../src/storage/blob-store';
import { createAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { createTestApp, type TestApp } from './support/test-app';

// SHA-256 from node:crypto, the reference implementation exhibits are named by (FIPS 180-4).
const sha256Hex = (b: Buffer) => createHash('sha256').update(b).digest('hex');

async function filesNamed(root: string, name: string): Promise<number> {
  const entries = await readdir(root, { recursive: true, withFileTypes: true }).catch(() => []);
  return entries.filter((e) => e.isFile() && e.name.startsWith(name)).length;
}

/** Stores an exhibit's files, writes its entry, redacts it; checks roll, blobs and the blocked list. */
async function redactStoredExhibit(t: TestApp, stored: (digest: string) => Promise<number>): Promise<void> {
  const registrar = await createAccount(t, { role: 'registrar' });
  const holder = await createAccount(t, { role: 'dealer' });
  const store = t.app.get<BlobStore>(BLOB_STORE);
  const lot = await t.app.get(LotsService).register({ id: holder.id, role: 'dealer' }, {
    description: description(),
  } as never);
  const original = randomBytes(2048);
  const thumb = randomBytes(256);
  for (const b of [original, thumb]) await store.put({ stream: Readable.from([b]) });
  const file = (b: Buffer) => ({ sha256: sha256Hex(b), size: b.length, mediaType: 'image/jpeg' });
  await t.app.get(LedgerService).append(lot.code, {
    kind: 'exhibit-added',
    actor: holder.id,
    body: {
      exhibit: { kind: 'hole', original: file(original), derivatives: [{ ...file(thumb), role: 'thumb' }] },
    },
  });
  expect(await stored(sha256Hex(original))).toBe(1);

  await registrar.agent
    .post('/api/registry/redactions')
    .set('X-Beadroll-Request', '1')
    .send({ lot: lot.code, seq: 1, reason: 'personal-data' })
    .expect(200);

  for (const b of [original, thumb]) {
    expect(await store.exists(sha256Hex(b))).toBe(false);
    expect(await stored(sha256Hex(b))).toBe(0);
  }
  const reader = t.app.get(RollReaderService);
  const entries = await reader.entries((await reader.findLot(lot.code))!.id);
  expect(entries[1]!.body).toBeNull();
  expect(verifyRoll(entries, { lot: lot.code }).ok).toBe(true);
  // The same bytes offered again are refused before anything is stored.
  await expect(t.app.get(BlockedDigestsService).assertAllowed([sha256Hex(original)])).rejects.toMatchObject({
    code: 'blocked_content',
  });
}

describe('redacting an exhibit removes its files', () => {
  describe('from the file-system store', () => {
    let t: TestApp;
    beforeAll(async () => {
      t = await createTestApp({ STORAGE_DRIVER: 'fs' });
    });
    afterAll(async () => {
      await t.close();
    });

    it('deletes the original and every derivative; the roll verifies', async () => {
      const root = join(t.dataDir, 'exhibits');
      await redactStoredExhibit(t, (d) => filesNamed(root, d));
    });
  });

  describe('from S3 (a fake S3 server on 127.0.0.1)', () => {
    let t: TestApp;
    let server: S3rver;
    let dir: string;
    let client: S3Client;
    beforeAll(async () => {
      dir = mkdtempSync(join(tmpdir(), 'redaction-s3-'));
      server = new S3rver({ port: 0, address: '127.0.0.1', silent: true, directory: dir });
      const { port } = (await server.run()) as { port: number };
      const endpoint = `http://127.0.0.1:${port}`;
      client = new S3Client({
        endpoint,
        region: 'us-east-1',
        forcePathStyle: true,
        credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
      });
      await client.send(new CreateBucketCommand({ Bucket: 'redactions' }));
      t = await createTestApp({
        STORAGE_DRIVER: 's3',
        S3_BUCKET: 'redactions',
        S3_ENDPOINT: endpoint,
        S3_ACCESS_KEY_ID: 'S3RVER',
        S3_SECRET_ACCESS_KEY: 'S3RVER',
        S3_FORCE_PATH_STYLE: 'true',
      });
    });
    afterAll(async () => {
      await t.close();
      client.destroy();
      await server.close();
      rmSync(dir, { recursive: true, force: true });
    });

    // The fake server keeps no versions (it refuses ListObjectVersions, which the store's sweep
    // allows for); the listing and the server's own files on disk must both be empty of the blob.
    it('deletes the objects from the bucket and from the server’s disk; the roll verifies', async () => {
      await redactStoredExhibit(t, async (d) => {
        const listed = await client.send(new ListObjectsV2Command({ Bucket: 'redactions' }));
        const keys = (listed.Contents ?? []).filter((o) => o.Key?.includes(d)).length;
        return keys + (await filesNamed(join(dir, 'redactions'), d)) > 0 ? 1 : 0;
      });
    });
  });
});
