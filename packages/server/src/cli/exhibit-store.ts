// The exhibit store's half of `npm run backup` and `npm run restore` (the tools run pg_dump and
// pg_restore for the database). Works for either store driver, through the same BlobStore the
// server uses. Usage:
//   node dist/cli/exhibit-store.js export DIR   every file an exhibit row names, as DIR/<sha256>
//   node dist/cli/exhibit-store.js import DIR   puts each DIR/<sha256> into an empty store
//   node dist/cli/exhibit-store.js check        every file an exhibit row names is stored and
//                                               hashes to its name
// Prints one JSON line with what it did; exit 0 when all is well, 1 when something is missing
// or altered, 2 when it could not run.
import 'reflect-metadata';
import { createHash } from 'node:crypto';
import { createWriteStream, existsSync, mkdirSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { loadConfig } from '../config/app-config';
import { createDataSource } from '../database/data-source';
import { storedExhibitDigests } from '../exhibits/stored-digests';
import { createBlobStore } from '../storage/storage.module';
import { BlobNotFoundError, type BlobStore } from '../storage/blob-store';

const HEX64 = /^[0-9a-f]{64}$/;

/** Every stored file an exhibit row names (original and derivatives), each once. */
async function namedDigests(): Promise<string[]> {
  const ds = createDataSource(loadConfig());
  await ds.initialize();
  try {
    return await storedExhibitDigests(ds);
  } finally {
    await ds.destroy();
  }
}

async function digestOf(store: BlobStore, sha256: string): Promise<string | null> {
  try {
    const hash = createHash('sha256');
    for await (const chunk of await store.get(sha256)) hash.update(chunk as Buffer);
    return hash.digest('hex');
  } catch (err) {
    if (err instanceof BlobNotFoundError) return null;
    throw err;
  }
}

async function exportTo(store: BlobStore, dir: string): Promise<{ files: number; missing: string[] }> {
  mkdirSync(dir, { recursive: true });
  const missing: string[] = [];
  let files = 0;
  for (const sha256 of await namedDigests()) {
    try {
      await pipeline(await store.get(sha256), createWriteStream(join(dir, sha256)));
      files += 1;
    } catch (err) {
      if (!(err instanceof BlobNotFoundError)) throw err;
      missing.push(sha256);
    }
  }
  return { files, missing };
}

async function importFrom(store: BlobStore, dir: string): Promise<{ files: number; altered: string[] }> {
  const names = existsSync(dir) ? readdirSync(dir).filter((n) => HEX64.test(n)) : [];
  for (const sha256 of names)
    if (await store.exists(sha256)) throw new Error(`the exhibit store is not empty (it holds ${sha256})`);
  const altered: string[] = [];
  for (const sha256 of names) {
    const put = await store.put({ path: join(dir, sha256) });
    if (put.sha256 !== sha256) {
      altered.push(sha256);
      await store.delete(put.sha256);
    }
  }
  return { files: names.length - altered.length, altered };
}

async function check(store: BlobStore): Promise<{ files: number; missing: string[]; altered: string[] }> {
  const missing: string[] = [];
  const altered: string[] = [];
  const names = await namedDigests();
  for (const sha256 of names) {
    const actual = await digestOf(store, sha256);
    if (actual === null) missing.push(sha256);
    else if (actual !== sha256) altered.push(sha256);
  }
  return { files: names.length, missing, altered };
}

async function main(): Promise<number> {
  const [command, dir] = process.argv.slice(2);
  const store = createBlobStore(loadConfig());
  if (command === 'export' && dir) {
    const r = await exportTo(store, dir);
    console.log(JSON.stringify(r));
    return r.missing.length ? 1 : 0;
  }
  if (command === 'import' && dir) {
    const r = await importFrom(store, dir);
    console.log(JSON.stringify(r));
    return r.altered.length ? 1 : 0;
  }
  if (command === 'check') {
    const r = await check(store);
    console.log(JSON.stringify(r));
    return r.missing.length || r.altered.length ? 1 : 0;
  }
  console.error('usage: exhibit-store export DIR | import DIR | check');
  return 2;
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(2);
  },
);
