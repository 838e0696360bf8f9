import { beforeAll, describe, expect, it } from 'vitest';
import { spawnSync, execSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const cli = join(root, 'tools/verify.mjs');
const example = readFileSync(join(root, 'docs/examples/bundle.json'), 'utf8');
let dir = '';

function run(...args: string[]): { code: number | null; out: string } {
  const r = spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', cwd: root });
  return { code: r.status, out: r.stdout + r.stderr };
}
function file(name: string, text: string): string {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}

describe('npm run verify', () => {
  beforeAll(() => {
    execSync('npm run build -w @beadroll/core', { cwd: root, stdio: 'ignore' });
    dir = mkdtempSync(join(tmpdir(), 'beadroll-verify-'));
  }, 60_000);

  it('exits 0 on an intact bundle', () => {
    const r = run(file('ok.json', example));
    expect(r.code).toBe(0);
    expect(r.out).toContain('6 lots, 18 entries');
    expect(r.out).toContain('verified');
  });
  it('exits 1 on a broken roll and names the lot and seq', () => {
    const b = JSON.parse(example);
    b.rolls[1].entries[4].body = b.rolls[1].entries[4].body.replace('high', 'low');
    const r = run(file('broken.json', JSON.stringify(b)));
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/broken: lot [0-9A-Z]{4}-[0-9A-Z]{4}-[0-9A-Z] seq 4 \(bad-body-digest\)/);
    expect(r.out).not.toMatch(/^verified/m);
  });
  const unreadable: Array<[string, string]> = [
    ['malformed JSON', '{"format":'],
    ['wrong types', JSON.stringify({ format: 'beadroll-bundle', version: 1, rolls: 'x', checkpoints: [] })],
    [
      'unknown version',
      JSON.stringify({ format: 'beadroll-bundle', version: 7, rolls: [], checkpoints: [] }),
    ],
    ['not a bundle', '[1,2,3]'],
  ];
  for (const [desc, text] of unreadable) {
    it(`exits 2 on ${desc}`, () => {
      const r = run(file(desc.replace(/ /g, '-') + '.json', text));
      expect(r.code).toBe(2);
      expect(r.out).not.toMatch(/^verified/m);
    });
  }
  it('exits 1, not 0, on unsafe integers and non-canonical headers inside a bundle', () => {
    const b = JSON.parse(example);
    b.rolls[0].entries[0].header = b.rolls[0].entries[0].header.replace('"seq":0', '"seq":9007199254740993');
    expect(run(file('unsafe.json', JSON.stringify(b))).code).toBe(1);
    const c = JSON.parse(example);
    c.rolls[0].entries[0].header = ' ' + c.rolls[0].entries[0].header;
    const r = run(file('noncanon.json', JSON.stringify(c)));
    expect(r.code).toBe(1);
    expect(r.out).toContain('non-canonical');
  });
  it('exits 1, naming the lot and the reason, on a readable bundle with a malformed roll', () => {
    const cases: Array<[string, (b: { rolls: Array<Record<string, unknown>> }) => void, string]> = [
      ['duplicate lot', (b) => b.rolls.push({ ...b.rolls[0]! }), 'duplicate-lot'],
      ['bad lot code', (b) => (b.rolls[0]!.lot = 'NOT-A-LOT'), 'bad-lot-code'],
      [
        'bad log index',
        (b) => ((b.rolls[0]!.entries as Array<Record<string, unknown>>)[0]!.logIndex = -3),
        'bad-log-index',
      ],
      ['bad roll', (b) => (b.rolls[0]!.scope = 'some'), 'bad-roll'],
      ['bad entry', (b) => ((b.rolls[0]!.entries as unknown[])[0] = 'x'), 'bad-entry'],
    ];
    for (const [desc, mutate, reason] of cases) {
      const b = JSON.parse(example);
      mutate(b);
      const r = run(file(desc.replace(/ /g, '-') + '.json', JSON.stringify(b)));
      expect(r.code, desc).toBe(1);
      expect(r.out).toContain(`(${reason})`);
    }
  });
  it('exits 2 on bytes that are not UTF-8, or a byte-order mark', () => {
    const p = join(dir, 'latin1.json');
    writeFileSync(
      p,
      Buffer.concat([
        Buffer.from(example.slice(0, 40)),
        Buffer.from([0xe9, 0xff]),
        Buffer.from(example.slice(40)),
      ]),
    );
    expect(run(p).code).toBe(2);
    const q = join(dir, 'bom.json');
    writeFileSync(q, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(example)]));
    expect(run(q).code).toBe(2);
  });
  it('exits 0 on a version-1 bundle and says which rolls are not fully checkable after a removal', () => {
    const v1 = readFileSync(new URL('./fixtures/bundle-v1.json', import.meta.url), 'utf8');
    const r = run(file('v1.json', v1));
    expect(r.code).toBe(0);
    expect(r.out).toContain('not fully checkable after a removal');
  });
  it('exits 2 on a file over the size limit (checked before reading), a missing file, or no argument', () => {
    const p = file('big.json', example);
    const r = run(p, '--max-bytes', '100');
    expect(r.code).toBe(2);
    expect(r.out).toContain('over the limit');
    expect(run(join(dir, 'nope.json')).code).toBe(2);
    expect(run().code).toBe(2);
    expect(run(dir).code).toBe(2);
  });
});
