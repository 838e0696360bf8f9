// beadroll-verify FILE [--max-bytes N] [--log-key KEY]: checks an exported bundle offline and
// prints one line per roll; with the registry's log key (its /api/log/key) also the bundle's
// checkpoints of the public log. Exit 0: every roll and link intact (and every checkpoint). 1: a readable bundle with a broken roll (lot, seq
// and reason named). 2: not a bundle at all (unreadable, over the size limit, not UTF-8, not
// JSON, not a bundle's shape, an unknown version), or a wrong command line.
import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { DEFAULT_MAX_BUNDLE_BYTES, type VerifierKey } from '@beadroll/core';
import { readLogKey, reportBundleBytes, reportLines, unreadableReport, type ExitCode } from './report.js';

export interface CliIo {
  out: (line: string) => void;
  err: (line: string) => void;
}

const USAGE =
  'usage: beadroll-verify FILE [--max-bytes N] [--log-key KEY]  (in the repository: npm run verify -- FILE)';

/** Reads at most `limit + 1` bytes, so an oversized file is never read whole. */
function readUpTo(file: string, limit: number): { bytes: Uint8Array; size: number } {
  const fd = openSync(file, 'r');
  try {
    const st = fstatSync(fd);
    if (!st.isFile()) throw new Error('not a file');
    if (st.size > limit) return { bytes: new Uint8Array(0), size: st.size };
    const want = st.size + 1;
    const buf = new Uint8Array(want);
    let got = 0;
    for (;;) {
      const n = readSync(fd, buf, got, want - got, null);
      if (n === 0) break;
      got += n;
      if (got === want) break; // it grew while being read
    }
    return { bytes: buf.subarray(0, got), size: got };
  } finally {
    closeSync(fd);
  }
}

/** Runs the command line with its arguments (without node and the script) and returns the exit status. */
export function runCli(args: string[], io: CliIo, usageLine = USAGE): ExitCode {
  const usage = (message: string): ExitCode => {
    io.err(message);
    io.err(usageLine);
    return 2;
  };
  let file: string | null = null;
  let maxBytes = DEFAULT_MAX_BUNDLE_BYTES;
  let logKey: VerifierKey | undefined;
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (a === '--log-key') {
      try {
        logKey = readLogKey(args[++i] ?? '');
      } catch (e) {
        return usage(`--log-key: ${(e as Error).message}`);
      }
    } else if (a === '--max-bytes') {
      const n = Number(args[++i]);
      if (!Number.isSafeInteger(n) || n <= 0) return usage('--max-bytes needs a positive whole number');
      maxBytes = n;
    } else if (a === '--help' || a === '-h') {
      io.out(usageLine);
      io.out(
        "--log-key KEY: the registry's log key (its /api/log/key), to check the bundle's checkpoints too.",
      );
      io.out('Exit 0: every roll intact. 1: a roll or checkpoint is broken. 2: the file is not a bundle.');
      return 0;
    } else if (file === null) file = a;
    else return usage(`unexpected argument ${a}`);
  }
  if (file === null) return usage('no bundle file given');
  let read: { bytes: Uint8Array; size: number };
  try {
    read = readUpTo(file, maxBytes);
  } catch (e) {
    return usage(`cannot read ${file}: ${(e as Error).message}`);
  }
  const report =
    read.size > maxBytes
      ? unreadableReport('too-large', `${file} is ${read.size} bytes, over the limit of ${maxBytes}`)
      : reportBundleBytes(read.bytes, maxBytes, logKey);
  const lines = reportLines(report);
  if (report.exitCode === 2) for (const l of lines) io.err(l);
  else for (const l of lines) io.out(l);
  return report.exitCode;
}
