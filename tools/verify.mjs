// Verifies an export bundle offline: npm run verify -- FILE [--max-bytes N]
// Exit 0: every roll and link intact. 1: broken (lot and seq named). 2: unreadable, not a
// bundle, or over the size limit (checked from the file's size before reading it).
import { readFileSync, statSync } from 'node:fs';
import {
  BundleError,
  DEFAULT_MAX_BUNDLE_BYTES,
  formatLotCode,
  parseBundleBytes,
  verifyBundle,
} from '@beadroll/core';

function usage(message) {
  console.error(message);
  console.error('usage: npm run verify -- FILE [--max-bytes N]');
  process.exit(2);
}

const args = process.argv.slice(2);
let file = null;
let maxBytes = DEFAULT_MAX_BUNDLE_BYTES;
for (let i = 0; i < args.length; i++) {
  if (args[i] === '--max-bytes') {
    const n = Number(args[++i]);
    if (!Number.isSafeInteger(n) || n <= 0) usage('--max-bytes needs a positive whole number');
    maxBytes = n;
  } else if (file === null) file = args[i];
  else usage(`unexpected argument ${args[i]}`);
}
if (file === null) usage('no bundle file given');

let bytes;
try {
  const st = statSync(file);
  if (!st.isFile()) usage(`${file} is not a file`);
  if (st.size > maxBytes) usage(`${file} is ${st.size} bytes, over the limit of ${maxBytes}`);
  bytes = readFileSync(file);
} catch (e) {
  usage(`cannot read ${file}: ${e.message}`);
}

let bundle;
try {
  bundle = parseBundleBytes(bytes, maxBytes);
} catch (e) {
  if (e instanceof BundleError) usage(`not a readable bundle (${e.code}): ${e.message}`);
  usage(`not a readable bundle: ${e.message}`);
}

const result = verifyBundle(bundle);
const lots = result.rolls.length;
console.log(
  `${lots} lot${lots === 1 ? '' : 's'}, ${result.entries} entries, ${result.links} cross-lot links`,
);
const lotName = (lot) => (lot ? formatLotCode(lot) : '(no valid lot code)');
for (const r of result.rolls) {
  const what = r.scope === 'link' ? 'link entries only' : `${r.entries} entries`;
  if (!r.ok)
    console.log(
      `  ${lotName(r.lot)}  BROKEN   at seq ${r.failure.seq}: ${r.failure.reason} — ${r.failure.message}`,
    );
  else if (r.unchecked.length > 0) {
    console.log(`  ${lotName(r.lot)}  intact, not fully checkable after a removal   (${what})`);
    for (const u of r.unchecked) console.log(`      seq ${u.seq}: could not check ${u.message}`);
  } else console.log(`  ${lotName(r.lot)}  intact   (${what}${r.state ? `, ${r.state.status}` : ''})`);
}
if (result.ok) {
  const partial = result.rolls.filter((r) => r.unchecked.length > 0).length;
  console.log(
    partial > 0
      ? `verified: every roll is unbroken and every link checks both ways; ${partial} roll${partial === 1 ? ' is' : 's are'} not fully checkable after a removal`
      : 'verified: every roll is unbroken and every link checks both ways',
  );
  process.exit(0);
}
for (const f of result.failures) console.log(`broken: lot ${lotName(f.lot)} seq ${f.seq} (${f.reason})`);
process.exit(1);
