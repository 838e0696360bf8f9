// A worker of the scale benchmark's bulk load: builds the rolls of a range of lots as the ledger
// would (each entry through core's buildEntry, the state through core's reduceEntry) and answers
// the rows of the lots, entries, entry_bodies and lot_views tables as COPY text, for the main
// thread to write while this worker builds the next range. Started by run.ts.
import { randomUUID } from 'node:crypto';
import { COLOURS, WORDS } from './words.mjs';
import { parentPort } from 'node:worker_threads';
import { buildEntry, generateLotCode, headOf, reduceEntry, seededRandom } from '@beadroll/core';

const FORMS = ['loose', 'strand', 'necklace', 'piece', 'mixed'];
const T0 = Date.UTC(2024, 0, 1);

/** COPY text format: backslash, tab, newline and carriage return escaped; \N is null. */
const SPECIAL = /[\\\t\n\r]/;
const esc = (v) => {
  if (v === null || v === undefined) return '\\N';
  const s = String(v);
  return SPECIAL.test(s)
    ? s.replace(/\\/g, '\\\\').replace(/\t/g, '\\t').replace(/\n/g, '\\n').replace(/\r/g, '\\r')
    : s;
};
const row = (cols) => `${cols.map(esc).join('\t')}\n`;

/**
 * Lots `first` … `first + counts.length - 1` (numbered as the benchmark numbers them), lot i
 * with `counts[i]` entries, all by `actor`, the entries numbered from `firstEntryId` (a range
 * the main thread took from the entries' identity sequence); codes and nonces from a generator
 * seeded by `first`.
 */
function build({ first, counts, actor, firstEntryId }) {
  let entryId = firstEntryId;
  const random = seededRandom(`scale-${first}`);
  const lots = [];
  const entries = [];
  const bodies = [];
  const views = [];
  let written = 0;
  counts.forEach((count, i) => {
    const n = first + i;
    const code = generateLotCode(random);
    const id = randomUUID();
    let head = null;
    let state = null;
    let observations = null;
    const colour = COLOURS[n % COLOURS.length];
    const word = WORDS[Math.floor(n / COLOURS.length) % WORDS.length];
    for (let seq = 0; seq < count; seq++) {
      const time = new Date(T0 + n * 60_000 + seq * 1000).toISOString();
      const draft =
        seq === 0
          ? {
              lot: code,
              kind: 'registered',
              body: {
                description: {
                  title: `Lot ${n}: ${colour} ${word} beads`,
                  form: FORMS[n % FORMS.length],
                  count: { value: 10 + (n % 500), estimated: n % 2 === 0 },
                  colours: [colour],
                  baseGlass: ['opaque'],
                  decoration: [],
                  listed: n % 3 !== 0,
                },
              },
            }
          : seq % 2 === 1
            ? {
                kind: 'observed',
                body: { observations: { hole: 'clean', surface: 'worn', note: `Look ${seq}.` } },
              }
            : { kind: 'note', body: { text: `Entry ${seq} of lot ${n}, written in bulk.` } };
      const built = buildEntry(head, { ...draft, time, actor }, { random });
      state = reduceEntry(state, { header: built.header, hash: built.stored.hash, body: built.body });
      head = headOf(built);
      entries.push(
        row([entryId, id, seq, built.header.kind, actor, time, built.stored.hash, built.stored.header]),
      );
      bodies.push(row([entryId++, built.stored.body]));
      if (draft.kind === 'observed') observations = JSON.stringify(draft.body.observations);
    }
    const d = state.description;
    lots.push(row([id, code, state.head.seq, state.head.hash, state.head.time, JSON.stringify(state)]));
    views.push(
      row([
        id,
        code,
        d.title,
        d.form,
        state.status,
        state.holder,
        state.listed,
        state.attribution?.body?.origin ?? null,
        state.remaining.value,
        state.remaining.estimated,
        state.dissents.length,
        null,
        observations,
        state.head.seq,
        [d.title, d.summary, d.colours.join(' '), d.decorationNote, d.condition].filter(Boolean).join(' '),
        new Date(T0 + n * 60_000).toISOString(),
        state.head.time,
      ]),
    );
    written += count;
  });
  return {
    lots: lots.join(''),
    entries: entries.join(''),
    bodies: bodies.join(''),
    views: views.join(''),
    written,
  };
}

parentPort.on('message', (job) => parentPort.postMessage({ id: job.id, ...build(job) }));
