// Exit codes of the verifier, as docs/ledger-format.md §11 defines them: 0 every roll and link
// intact, 1 a readable bundle with a broken roll (lot, seq and reason named), 2 not a bundle at
// all. Run twice: through `npm run verify` in this repository, and from the packed package run
// with npx in an empty directory with the registry unreachable.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  EXAMPLE,
  EXAMPLE_V1,
  exampleWithCheckpoint,
  filesIn,
  NOT_BUNDLES,
  REPO,
  tamperedExample,
} from './fixtures.js';

interface Run {
  code: number | null;
  out: string;
  err: string;
}

const tampered = tamperedExample();
const logged = exampleWithCheckpoint();
const formatted = (lot: string) => `${lot.slice(0, 4)}-${lot.slice(4, 8)}-${lot.slice(8)}`;
const dir = filesIn({
  'intact.json': EXAMPLE,
  'v1.json': EXAMPLE_V1,
  'broken.json': tampered.text,
  'logged.json': logged.text,
  ...Object.fromEntries(NOT_BUNDLES.map((f) => [f.name, f.bytes])),
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function suite(name: string, setup: () => void, run: (...args: string[]) => Run): void {
  describe(name, () => {
    beforeAll(setup, 180_000);

    it('exits 0 on an intact bundle and prints every roll', () => {
      const r = run(join(dir, 'intact.json'));
      expect(r.err).toBe('');
      expect(r.code).toBe(0);
      expect(r.out).toContain('6 lots, 18 entries, 3 cross-lot links');
      expect(r.out.match(/ intact /g)).toHaveLength(6);
      expect(r.out).toMatch(/^verified: /m);
    });

    it('exits 0 on a version-1 bundle and names the roll that is not fully checkable after a removal', () => {
      const r = run(join(dir, 'v1.json'));
      expect(r.code).toBe(0);
      expect(r.out).toMatch(/^ {2}[0-9A-Z-]{11} {2}intact, not fully checkable after a removal/m);
      expect(r.out).toMatch(/^ {6}seq \d+: could not check /m);
      expect(r.out).toMatch(/^verified: .*; 1 roll is not fully checkable after a removal$/m);
    });

    it('with --log-key, checks the bundle’s checkpoint of the public log too (format §14.5)', () => {
      const good = run(join(dir, 'logged.json'), '--log-key', logged.logKey);
      expect(good.code).toBe(0);
      expect(good.out).toMatch(/^ {2}checkpoint of 18 entries {2}signature checks with the log's key$/m);
      expect(good.out).not.toContain('NOT SHOWN');
      const without = run(join(dir, 'logged.json'));
      expect(without.code).toBe(0);
      expect(without.out).toContain(
        "1 checkpoint of the public log not checked: give the log's key with --log-key",
      );
      const forged = run(join(dir, 'logged.json'), '--log-key', logged.otherKey);
      expect(forged.code).toBe(1);
      expect(forged.out).toMatch(/^broken: a checkpoint of the public log: its signature does not check/m);
      const wrong = run(join(dir, 'logged.json'), '--log-key', 'not-a-key');
      expect(wrong.code).toBe(2);
      expect(wrong.err).toMatch(/^--log-key: the log key is not a verifier key/m);
    });

    it('exits 1 on a broken roll, naming the lot, the entry and the reason', () => {
      const r = run(join(dir, 'broken.json'));
      expect(r.code).toBe(1);
      expect(r.out).toContain(`${formatted(tampered.lot)}  BROKEN   at seq ${tampered.seq}: bad-body-digest`);
      expect(r.out).toContain(`broken: lot ${formatted(tampered.lot)} seq ${tampered.seq} (bad-body-digest)`);
      expect(r.out).not.toMatch(/^verified/m);
    });

    for (const f of NOT_BUNDLES) {
      it(`exits 2 on a file that is not a bundle (${f.why}: ${f.name})`, () => {
        const r = run(join(dir, f.name));
        expect(r.code).toBe(2);
        expect(r.err).toContain(`not a readable bundle (${f.why})`);
        expect(r.out).toBe('');
      });
    }

    it('exits 2 on a file over the size limit, a missing file, a folder or no file at all', () => {
      const big = run(join(dir, 'intact.json'), '--max-bytes', '100');
      expect(big.code).toBe(2);
      expect(big.err).toContain('too-large');
      expect(run(join(dir, 'missing.json')).code).toBe(2);
      expect(run(dir).code).toBe(2);
      const none = run();
      expect(none.code).toBe(2);
      expect(none.err).toContain('no bundle file given');
    });
  });
}

const capture = (cmd: string, args: string[], opts: { cwd: string; env?: NodeJS.ProcessEnv }): Run => {
  const r = spawnSync(cmd, args, { encoding: 'utf8', cwd: opts.cwd, env: opts.env ?? process.env });
  return { code: r.status, out: r.stdout, err: r.stderr };
};

suite(
  'npm run verify',
  () => undefined,
  (...args) => capture('npm', ['run', '--silent', 'verify', '--', ...args], { cwd: REPO }),
);

let packDir = '';
let tarball = '';
// A clean environment (none of the npm settings of the run that started these tests) and a
// registry address nothing listens on: the packed verifier must need nothing from it.
const offline = {
  ...Object.fromEntries(Object.entries(process.env).filter(([k]) => !k.toLowerCase().startsWith('npm_'))),
  npm_config_registry: 'http://127.0.0.1:9/',
  npm_config_offline: 'true',
  npm_config_update_notifier: 'false',
};
suite(
  'the packed package, run with npx',
  () => {
    packDir = mkdtempSync(join(tmpdir(), 'beadroll-verify-pack-'));
    const pack = capture('npm', ['pack', '--silent', '--pack-destination', packDir], {
      cwd: join(REPO, 'packages/verify'),
    });
    expect(pack.code, pack.err).toBe(0);
    tarball = join(
      packDir,
      readdirSync(packDir).find((f) => f.endsWith('.tgz'))!,
    );
    mkdirSync(join(packDir, 'cache'));
  },
  (...args) =>
    // As a buyer would type it: the file next to them, named with ./ (npx reads a bare or
    // absolute name as a command).
    capture('npx', ['--yes', `./${basename(tarball)}`, ...args], {
      cwd: packDir,
      env: { ...offline, npm_config_cache: join(packDir, 'cache') },
    }),
);
afterAll(() => {
  if (packDir) rmSync(packDir, { recursive: true, force: true });
});

describe('the packed package', () => {
  it('holds the command line and the page, and names no dependency to install', () => {
    const list = capture('tar', ['-tzf', tarball], { cwd: REPO });
    expect(list.out.trim().split('\n').sort()).toEqual([
      'package/README.md',
      'package/dist/beadroll-verify.mjs',
      'package/dist/verify.html',
      'package/package.json',
    ]);
    const pkg = JSON.parse(capture('tar', ['-xzOf', tarball, 'package/package.json'], { cwd: REPO }).out) as {
      dependencies?: object;
      bin: Record<string, string>;
    };
    expect(pkg.dependencies ?? {}).toEqual({});
    expect(pkg.bin).toEqual({ 'beadroll-verify': 'dist/beadroll-verify.mjs' });
  });
});
