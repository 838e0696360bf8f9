// Benchmark: verify a generated 100,000-entry roll with the incremental verifier, against a
// baseline that only hashes the same canonical bytes with node:crypto, in the same run.
// Usage: npm run build -w @beadroll/core && npm run bench:verify [-- ENTRIES]
import { createHash } from 'node:crypto';
import { TextEncoder } from 'node:util';
import { buildEntry, createRollVerifier, DOMAIN, headOf, seededRandom } from '@beadroll/core';

const N = Number(process.argv[2] ?? 100_000);
const random = seededRandom('bench');
const lot = '7K2QM9XAT';
const holder = 'acct-bench-holder';
const t0 = Date.UTC(2025, 0, 1);
const time = (i) => new Date(t0 + i * 1000).toISOString();

console.log(`generating a roll of ${N} entries ...`);
const entries = [];
let head = null;
for (let i = 0; i < N; i++) {
  let draft;
  if (i === 0) {
    draft = {
      lot,
      kind: 'registered',
      body: {
        description: {
          title: 'Benchmark lot',
          form: 'loose',
          count: { value: 500, estimated: true },
          colours: ['amber'],
          baseGlass: ['transparent'],
          decoration: [],
          listed: true,
        },
      },
    };
  } else if (i % 3 === 0) {
    draft = {
      kind: 'observed',
      body: { observations: { hole: 'clean', surface: 'glossy', note: `look ${i}` } },
    };
  } else {
    draft = { kind: 'note', body: { text: `Entry number ${i} of the benchmark roll.` } };
  }
  const b = buildEntry(head, { ...draft, time: time(i), actor: holder }, { random });
  head = headOf(b);
  entries.push(b.stored);
}

function baseline() {
  const enc = new TextEncoder();
  const entryTag = enc.encode(DOMAIN.entry + '\0');
  const bodyTag = enc.encode(DOMAIN.body + '\0');
  let x = 0;
  for (const e of entries) {
    const h = createHash('sha256').update(entryTag).update(e.header).digest('hex');
    const b = createHash('sha256').update(bodyTag).update(e.body).digest('hex');
    x ^= h.charCodeAt(0) ^ b.charCodeAt(0);
  }
  return x;
}

function ours() {
  const v = createRollVerifier(lot);
  for (const e of entries) {
    const f = v.push(e);
    if (f) throw new Error(`unexpected failure at ${f.seq}: ${f.reason}`);
  }
  const r = v.finish();
  if (!r.ok) throw new Error('roll did not verify');
  return r.entries;
}

/** Wall time and this process's CPU time (user + system, every thread) of one call, in seconds. */
function timed(fn) {
  const cpu = process.cpuUsage();
  const start = process.hrtime.bigint();
  fn();
  const wall = Number(process.hrtime.bigint() - start) / 1e9;
  const used = process.cpuUsage(cpu);
  return { wall, cpu: (used.user + used.system) / 1e6 };
}

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

// One warm-up pass each, then ROUNDS measured rounds, ours and the baseline one after the other,
// so a change in the machine's load touches both sides of a round alike. CPU time is printed
// beside wall time: on a shared machine it moves far less from round to round.
const ROUNDS = 5;
baseline();
ours();
globalThis.gc?.();
const heapBefore = process.memoryUsage().heapUsed;
let heapPeak = heapBefore;
const rounds = [];
for (let r = 0; r < ROUNDS; r++) {
  const o = timed(() => {
    const v = createRollVerifier(lot);
    let i = 0;
    for (const e of entries) {
      if (v.push(e)) throw new Error('broken');
      if (r === 0 && ++i % 10_000 === 0) heapPeak = Math.max(heapPeak, process.memoryUsage().heapUsed);
    }
    if (!v.finish().ok) throw new Error('broken');
  });
  const b = timed(baseline);
  rounds.push({ o, b });
}

const wallRatio = median(rounds.map(({ o, b }) => b.wall / o.wall));
const cpuRatio = median(rounds.map(({ o, b }) => b.cpu / o.cpu));
const oursRate = N / median(rounds.map(({ o }) => o.wall));
const baseRate = N / median(rounds.map(({ b }) => b.wall));
const mb = (x) => (x / 1024 / 1024).toFixed(1);
const verdict = (x) => `(target >= 0.5) ${x >= 0.5 ? 'met' : 'NOT met'}`;
console.log(`entries:                ${N}, ${ROUNDS} rounds, medians`);
console.log(`ours (incremental):     ${Math.round(oursRate).toLocaleString('en')} entries/s`);
console.log(`baseline (node:crypto): ${Math.round(baseRate).toLocaleString('en')} entries/s`);
console.log(`ratio ours/baseline, wall time: ${wallRatio.toFixed(2)}  ${verdict(wallRatio)}`);
console.log(`ratio ours/baseline, CPU time:  ${cpuRatio.toFixed(2)}  ${verdict(cpuRatio)}`);
console.log(`heap growth while verifying (sampled): ${mb(heapPeak - heapBefore)} MB`);
console.log(
  `peak RSS of the process (incl. the generated roll): ${mb(process.resourceUsage().maxRSS * 1024)} MB`,
);
console.log(
  `load average at the end: ${(await import('node:os'))
    .loadavg()
    .map((x) => x.toFixed(1))
    .join(' ')}`,
);

const BROWSER_N = 10_000;
const { verifyInChromium } = await import('./browser.mjs');
const ms = await verifyInChromium(BROWSER_N);
console.log(
  `Chromium, ${BROWSER_N.toLocaleString('en')} entries (core as bundled for browsers): ${(ms / 1000).toFixed(2)} s ` +
    `(target ≤ 1 s) ${ms <= 1000 ? 'met' : 'NOT met'}`,
);
