import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { createAccount } from './support/accounts';
import { imageOf } from './support/exhibit-fixtures';
import { sha256, upload } from './support/exhibit-http';
import { handOver, registerLot } from './support/lot-fixtures';
import { createEmptyDatabase, type TestDatabase, useTestApp } from './support/test-app';

const REPO = resolve(__dirname, '..', '..', '..');

/** Runs `npm run backup` / `npm run restore` (their TypeScript, as the npm scripts do) against a test database. */
function tool(name: 'backup' | 'restore', dir: string, env: Record<string, string>) {
  const r = spawnSync(join(REPO, 'node_modules', '.bin', 'tsx'), [join(REPO, 'tools', `${name}.ts`), dir], {
    cwd: REPO,
    env: { ...process.env, ...env, BEADROLL_SKIP_BUILD: '1' },
    encoding: 'utf8',
  });
  return { code: r.status, out: `${r.stdout}${r.stderr}` };
}

describe('backup and restore', () => {
  let empty: TestDatabase;
  let work: string;

  const t = useTestApp();
  beforeAll(async () => {
    empty = await createEmptyDatabase();
    work = mkdtempSync(join(tmpdir(), 'beadroll-backup-'));
  });
  afterAll(async () => {
    await empty.drop();
    rmSync(work, { recursive: true, force: true });
  });

  it('round-trips the database and every exhibit file into an empty database and folder', async () => {
    const a = await createAccount(t, { role: 'dealer' });
    const b = await createAccount(t, { role: 'dealer' });
    const codes: string[] = [];
    for (const title of ['Green hearts', 'Blue eyes']) {
      codes.push((await registerLot(a, { title })).code);
    }
    const png = await imageOf('png');
    await upload(a.agent, codes[0]!, png, { kind: 'close-up' }, 'a.png', 'image/png').expect(201);
    await handOver(a, codes[1]!, b);

    const dir = join(work, 'backup');
    const made = tool('backup', dir, { PGDATABASE: t.db.name, DATA_DIR: t.dataDir });
    expect(made.out).toContain('backup written');
    expect(made.code).toBe(0);
    const manifest = JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8'));
    expect(manifest.database.counts).toMatchObject({ lots: 2, entries: 5, exhibits: 1 });
    // Original, web and thumbnail: each named by the SHA-256 of its bytes (FIPS 180-4).
    expect(manifest.exhibits.files).toHaveLength(3);
    for (const f of manifest.exhibits.files) expect(sha256(readFileSync(join(dir, f.path)))).toBe(f.sha256);

    // Into a database with tables: refused, nothing touched.
    const busy = tool('restore', dir, { PGDATABASE: t.db.name, DATA_DIR: join(work, 'unused') });
    expect(busy.code).toBe(2);
    expect(busy.out).toContain('is not empty');

    const data = join(work, 'restored-data');
    const back = tool('restore', dir, { PGDATABASE: empty.name, DATA_DIR: data });
    expect(back.out).toContain('audit passed, exhibit digests all match');
    expect(back.code).toBe(0);
    expect(back.out).toContain('restored 2 lots, 5 entries, 3 exhibit files');
    for (const f of manifest.exhibits.files) {
      const s = f.sha256 as string;
      expect(existsSync(join(data, 'exhibits', s.slice(0, 2), s.slice(2, 4), s))).toBe(true);
    }
  });

  it('refuses a backup whose files no longer match the manifest', () => {
    const dir = join(work, 'backup');
    const [file] = JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')).exhibits.files;
    const bytes = readFileSync(join(dir, file.path));
    bytes[bytes.length - 1] ^= 1;
    writeFileSync(join(dir, file.path), bytes);
    const r = tool('restore', dir, { PGDATABASE: empty.name, DATA_DIR: join(work, 'other') });
    expect(r.code).toBe(2);
    expect(r.out).toContain(`${file.path} does not match its digest`);
  });
});
