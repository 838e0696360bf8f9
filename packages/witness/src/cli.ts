#!/usr/bin/env node
// A witness of a Beadroll log: npm run witness -- URL [--state FILE] [--key FILE] [--name NAME]
//   [--evidence DIR] [--watch SECONDS] [--print-key]
// Exit codes: 0 cosigned (or key printed), 1 could not check (network, refused), 3 the log is
// inconsistent with what this witness saw before (evidence written), 2 bad usage.
import { hostname } from 'node:os';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { loadWitnessSigner, runWitness, witnessVerifierKey } from './witness.js';

function usage(message: string): never {
  console.error(message);
  console.error(
    'usage: npm run witness -- URL [--state FILE] [--key FILE] [--name NAME] [--evidence DIR] [--watch SECONDS] [--print-key]',
  );
  process.exit(2);
}

let parsed;
try {
  parsed = parseArgs({
    allowPositionals: true,
    options: {
      state: { type: 'string', default: 'witness-state.json' },
      key: { type: 'string', default: 'witness.key' },
      name: { type: 'string', default: `witness.${hostname().toLowerCase()}.invalid` },
      evidence: { type: 'string', default: 'witness-evidence' },
      watch: { type: 'string' },
      'print-key': { type: 'boolean', default: false },
    },
  });
} catch (e) {
  usage((e as Error).message);
}
const { values, positionals } = parsed;
const keyFile = resolve(values.key);
if (values['print-key']) {
  console.log(witnessVerifierKey(loadWitnessSigner(keyFile, values.name)));
  process.exit(0);
}
const url = positionals[0];
if (!url || !/^https?:\/\//.test(url)) usage('the log address (http or https) is missing');
const watch = values.watch === undefined ? 0 : Number(values.watch);
if (!Number.isInteger(watch) || watch < 0) usage('--watch is a whole number of seconds');

for (;;) {
  const outcome = await runWitness({
    url,
    stateFile: resolve(values.state),
    keyFile,
    name: values.name,
    evidenceDir: resolve(values.evidence),
  });
  if (outcome.status === 'cosigned') {
    const from =
      outcome.previousSize === null ? 'first checkpoint seen' : `consistent with ${outcome.previousSize}`;
    console.log(`cosigned the checkpoint of ${outcome.size} entries (${from})`);
  } else if (outcome.status === 'inconsistent') {
    console.error(`INCONSISTENT: ${outcome.message}`);
    console.error(`evidence: ${outcome.evidence}`);
    process.exit(3);
  } else {
    console.error(`could not witness: ${outcome.message}`);
    if (!watch) process.exit(1);
  }
  if (!watch) break;
  await new Promise((r) => setTimeout(r, watch * 1000));
}
