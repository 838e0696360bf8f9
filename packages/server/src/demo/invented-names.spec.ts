import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

// The demo scenario, the fixtures, the documentation and the API examples use only invented
// places (seed-demo/invented-names.json) and reserved domains: `.example` and `.invalid` are
// reserved by RFC 2606 §2 for documentation and for names that must never resolve.
const REPO = join(__dirname, '..', '..', '..', '..');
const names = JSON.parse(readFileSync(join(REPO, 'seed-demo', 'invented-names.json'), 'utf8')) as {
  towns: string[];
  countries: string[];
};
const invented = new Set([...names.towns, ...names.countries]);

const tracked = execFileSync('git', ['ls-files'], { cwd: REPO, encoding: 'utf8' })
  .split('\n')
  .filter((f) => /\.(ts|tsx|mjs|json|md)$/.test(f) && !f.endsWith('package-lock.json'));
const read = (f: string) => readFileSync(join(REPO, f), 'utf8');
const isTestOrFixture = (f: string) =>
  /(^|\/)(test|e2e|fixtures)\//.test(f) ||
  /\.(spec|e2e-spec|test|e2e)\.tsx?$/.test(f) ||
  /fixtures?\.ts$/.test(f);
const demoFiles = tracked.filter((f) => f.startsWith('seed-demo/') && f.endsWith('.json'));
const docs = tracked.filter((f) => f.startsWith('docs/') || f === 'README.md' || f === 'DEVELOPERS.md');
const sources = tracked.filter((f) => /\.(ts|tsx)$/.test(f));

/** Every string of a JSON value, with the key it sits under. */
function strings(v: unknown, key = ''): [string, string][] {
  if (typeof v === 'string') return [[key, v]];
  if (Array.isArray(v)) return v.flatMap((x) => strings(x, key));
  if (v && typeof v === 'object') return Object.entries(v).flatMap(([k, x]) => strings(x, k));
  return [];
}

// A place-looking phrase: capitalised words ending in a common English place element, or one word
// built on one (Oldbridge, Marrowby, Ostmark). Bead origins (Venice, Bohemia) are trade facts, not
// demo places, and do not look like this.
const PLACE_ELEMENT =
  'Ford|Vale|Combe|Lea|Hythe|Moor|Green|Bridge|Water|Cross|Brook|Wick|Hollow|Isles|Marches|Reach|Shires|Heath|Hill|Dale|Mere|Gate|End|Field|Wood|Haven|Port|Cove';
const PHRASE = new RegExp(`\\b(?:[A-Z][a-z]+ )+(?:${PLACE_ELEMENT})\\b`, 'g');
const COMPOUND =
  /\b[A-Z][a-z]*(?:bridge|by|ford|mark|land|mere|gate|combe|lea|wick|moor|ley|field|well|worth|bury|borough|ham|ton|stead|hollow|brook)\b/g;
// Words that match the compound pattern but are not places.
const NOT_PLACES = new Set([
  'Beadroll',
  'Crockford', // Douglas Crockford, author of the Base 32 encoding
  'Smiley', // a character name in the RFC 8785 test data
  'Ashdown', // a demo dealer's surname
]);

function placeLike(text: string): string[] {
  const phrases = [...text.matchAll(PHRASE)].map((m) => m[0]);
  const words = [...text.matchAll(COMPOUND)].map((m) => m[0]);
  return [...phrases, ...words.filter((w) => !NOT_PLACES.has(w) && !phrases.some((p) => p.includes(w)))];
}

function notInvented(found: string[]): string[] {
  return found.filter((p) => !invented.has(p) && ![...invented].some((n) => n.includes(p)));
}

describe('demo places are invented', () => {
  it('every town and country in the demo scenario is on the list of invented names', () => {
    const seen: string[] = [];
    for (const f of demoFiles) {
      if (f === 'seed-demo/invented-names.json') continue;
      for (const [key, value] of strings(JSON.parse(read(f)))) {
        if (key === 'town' || key === 'country') {
          seen.push(value);
          expect({ file: f, value, invented: invented.has(value) }).toEqual({
            file: f,
            value,
            invented: true,
          });
        }
      }
    }
    expect(seen.length).toBeGreaterThan(5);
  });

  it('every place named in the demo scenario’s words (sources, notes, rationales) is on the list', () => {
    const bad: string[] = [];
    for (const f of demoFiles) {
      if (f === 'seed-demo/invented-names.json') continue;
      for (const [key, value] of strings(JSON.parse(read(f)))) {
        if (['email', 'displayName', 'handle', 'password'].includes(key)) continue;
        for (const p of notInvented(placeLike(value))) bad.push(`${f}: ${p} (in "${value}")`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('every town and country in tests, fixtures and API examples is on the list', () => {
    const literal =
      /\b(?:town|country)\s*[:=]\s*(?:\w+\.\w+\s*\?\?\s*)?['"`]([A-Z][^'"`]*)['"`]|name: '(?:Town|Country)' \}\)\.fill\('([^']*)'\)|example: '([^']*)' \}\)\s*\n(?:\s*@[^\n]*\n)*\s*(?:town|country)[?!]?:/g;
    const bad: string[] = [];
    let count = 0;
    for (const f of sources) {
      for (const m of read(f).matchAll(literal)) {
        const value = m[1] ?? m[2] ?? m[3]!;
        count += 1;
        if (!invented.has(value)) bad.push(`${f}: ${value}`);
      }
    }
    expect(bad).toEqual([]);
    expect(count).toBeGreaterThan(10);
  });

  it('places in the documentation and the test fixtures are invented', () => {
    const bad: string[] = [];
    for (const f of [...docs, ...tracked.filter((t) => isTestOrFixture(t) && t.endsWith('.json'))]) {
      for (const p of notInvented(placeLike(read(f)))) bad.push(`${f}: ${p}`);
    }
    expect(bad).toEqual([]);
  });
});

describe('domains are reserved', () => {
  // A name without a dot (a bare test string) is no domain; a port does not change the name.
  const reserved = (host: string) => {
    const name = host.replace(/:\d+$/, '');
    return !name.includes('.') || /(^|\.)(example|invalid)$/i.test(name) || name === '127.0.0.1';
  };

  it('every e-mail address anywhere in the project is under .example or .invalid', () => {
    const bad: string[] = [];
    let count = 0;
    for (const f of tracked) {
      for (const m of read(f).matchAll(/[\w.+-]+@([A-Za-z0-9-]+(?:\.[A-Za-z0-9-]+)+)\b/g)) {
        if (/^\d/.test(m[1]!) || m[0].startsWith('@')) continue; // package versions such as x@1.2.3
        count += 1;
        if (!reserved(m[1]!)) bad.push(`${f}: ${m[0]}`);
      }
    }
    expect(bad).toEqual([]);
    expect(count).toBeGreaterThan(10);
  });

  it('every web address in the demo, the docs, tests and API examples is reserved, or cites a source', () => {
    const bad: string[] = [];
    const files = [...demoFiles, ...docs, ...tracked.filter(isTestOrFixture)];
    for (const f of files) {
      for (const line of read(f).split('\n')) {
        // Citations of a source sit in comments and in fixtures' desc/source/url fields.
        if (/^\s*(\/\/|\*|\/\*)/.test(line) || /"(desc|description|source|sources|url|title)"\s*:/.test(line))
          continue;
        for (const m of line.matchAll(/\bhttps?:\/\/([\w.-]+(?::\d+)?)/gi)) {
          if (!reserved(m[1]!) && !/^www\.w3\.org$/.test(m[1]!)) bad.push(`${f}: ${m[0]}`);
        }
      }
    }
    expect(bad).toEqual([]);
  });

  it('every tag host in the fixtures is reserved', () => {
    const hosts: string[] = [];
    for (const f of tracked.filter(isTestOrFixture)) {
      for (const m of read(f).matchAll(/"host":\s*"([^"]+)"|\bHOST\w*\s*=\s*'([^']+)'/g))
        hosts.push(m[1] ?? m[2]!);
    }
    const bare = (h: string) => h.replace(/^https?:\/\//i, '').replace(/[/:].*$/, '');
    const bad = hosts.filter((h) => bare(h).includes('.') && !reserved(bare(h)));
    expect(bad).toEqual([]);
    expect(hosts.length).toBeGreaterThan(3);
  });
});
