// The browser half of the verification benchmark: core bundled for browsers (so hashing is
// @noble/hashes' script, as on a buyer's phone), a roll of N entries built inside Chromium and
// then verified there, timed with the page's own clock. Target: 10,000 entries in ≤ 1 s.
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';
import { build } from 'vite';

const REPO = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..', '..');

async function coreForBrowsers() {
  const out = await build({
    configFile: false,
    logLevel: 'warn',
    build: {
      write: false,
      minify: true,
      lib: { entry: join(REPO, 'packages/core/dist/index.js'), name: 'beadrollCore', formats: ['iife'] },
    },
  });
  const chunks = (Array.isArray(out) ? out : [out]).flatMap((o) => o.output);
  return chunks.find((c) => c.type === 'chunk').code;
}

/** Verifies an `n`-entry roll in Chromium; returns the median of `rounds` timings in ms. */
export async function verifyInChromium(n, rounds = 3) {
  const code = await coreForBrowsers();
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true });
  try {
    const page = await browser.newPage();
    await page.addScriptTag({ content: code });
    return await page.evaluate(
      ({ n, rounds }) => {
        const core = globalThis.beadrollCore;
        const random = core.seededRandom('bench');
        const lot = '7K2QM9XAT';
        const t0 = Date.UTC(2025, 0, 1);
        const entries = [];
        let head = null;
        for (let i = 0; i < n; i++) {
          const draft =
            i === 0
              ? {
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
                }
              : i % 3 === 0
                ? {
                    kind: 'observed',
                    body: { observations: { hole: 'clean', surface: 'glossy', note: `look ${i}` } },
                  }
                : { kind: 'note', body: { text: `Entry number ${i} of the benchmark roll.` } };
          const time = new Date(t0 + i * 1000).toISOString();
          const b = core.buildEntry(head, { ...draft, time, actor: 'acct-bench-holder' }, { random });
          head = core.headOf(b);
          entries.push(b.stored);
        }
        const times = [];
        for (let r = 0; r < rounds; r++) {
          const start = globalThis.performance.now();
          const v = core.createRollVerifier(lot);
          for (const e of entries) if (v.push(e)) throw new Error('the roll did not verify');
          if (!v.finish().ok) throw new Error('the roll did not verify');
          times.push(globalThis.performance.now() - start);
        }
        return times.sort((a, b) => a - b)[Math.floor(times.length / 2)];
      },
      { n, rounds },
    );
  } finally {
    await browser.close();
  }
}
