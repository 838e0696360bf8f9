import {
  BundleError,
  DEFAULT_MAX_BUNDLE_BYTES,
  formatLotCode,
  parseBundleBytes,
  parseBundleText,
  parseVerifierKey,
  verifyBundle,
  verifyBundleCheckpoint,
  type Bundle,
  type BundleVerification,
  type VerifierKey,
} from '@beadroll/core';

/** Exit status of the command line: 0 intact, 1 a readable bundle with a broken roll, 2 not a bundle. */
export type ExitCode = 0 | 1 | 2;

/** What went wrong with one roll, as core's verifier reported it. */
export interface RollProblem {
  seq: number | null;
  reason: string;
  message: string;
}

/** A rule core could not apply to one entry of an intact roll (a version-1 roll after a removal). */
export interface UncheckedLine {
  seq: number | null;
  message: string;
}

/** One roll of a verified bundle, ready to print or show. */
export interface RollLine {
  /** Canonical lot code, or null when the roll names none. */
  lot: string | null;
  /** The code as printed on tags (with its hyphens). */
  code: string;
  scope: string;
  ok: boolean;
  entries: number;
  /** Where the lot stands, when its whole roll is in the bundle and intact. */
  status: string | null;
  problem: RollProblem | null;
  /** Rules that could not be checked after a removal: the roll is intact but not fully checkable. */
  unchecked: UncheckedLine[];
  /** Anything else the verifier said about this roll, in words. */
  notes: string[];
}

/** One checkpoint of the public log carried by the bundle, as checked with the log's key. */
export interface CheckpointLine {
  ok: boolean;
  /** Entries the checkpoint covers, when its signature verified. */
  size: number | null;
  /** Why the checkpoint's note did not verify. */
  message: string | null;
  /** Each roll's entry the checkpoint says is in the log, and whether its proof holds. */
  inclusions: Array<{ code: string; seq: number; logIndex: number; ok: boolean; message: string | null }>;
}

/** The outcome of checking one file, shared by the command line and the offline page. */
export interface Report {
  exitCode: ExitCode;
  /** One line: intact, broken or unreadable. */
  headline: string;
  /** Counts of lots, entries and links, when the file was a bundle. */
  summary: string | null;
  rolls: RollLine[];
  /** Problems the verifier reported that belong to no single roll of the bundle. */
  problems: RollProblem[];
  /** Every failure core reported, one per broken roll or link, in its order. */
  failures: Array<RollProblem & { lot: string | null }>;
  /** Anything else the verifier said about the bundle as a whole. */
  notes: string[];
  /** Why the file is not a bundle at all (exit 2). */
  unreadable: { code: string; message: string } | null;
  /** The bundle's log checkpoints as checked with the log's key (§14.5); empty without a key. */
  checkpoints: CheckpointLine[];
  /** Checkpoints the file carries that were not checked, for want of the log's key. */
  uncheckedCheckpoints: number;
}

/** Reads the log's verifier key text (`name+keyid+base64`); throws a message in words when it is not one. */
export function readLogKey(text: string): VerifierKey {
  try {
    return parseVerifierKey(text.trim());
  } catch (e) {
    throw new Error(`the log key is not a verifier key (${e instanceof Error ? e.message : String(e)})`, {
      cause: e,
    });
  }
}

const ROLL_KEYS = new Set(['lot', 'scope', 'entries', 'ok', 'failure', 'state', 'unchecked']);
const RESULT_KEYS = new Set(['ok', 'rolls', 'entries', 'links', 'failures']);

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

function words(key: string): string {
  return key
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .replace(/[-_]/g, ' ')
    .toLowerCase();
}

function noteText(value: unknown): string | null {
  if (typeof value === 'string') return value;
  if (value && typeof value === 'object' && !Array.isArray(value)) {
    const o = value as Record<string, unknown>;
    const reason = typeof o.reason === 'string' ? o.reason : typeof o.code === 'string' ? o.code : null;
    const message = typeof o.message === 'string' ? o.message : null;
    const seq = typeof o.seq === 'number' ? `at seq ${o.seq}` : null;
    const parts = [reason, seq].filter(Boolean).join(' ');
    if (parts || message) return [parts, message].filter(Boolean).join(': ');
  }
  return null;
}

/**
 * Whatever the verifier's result holds beyond the fields this module knows, in words: newer
 * versions of the format add caveats and reasons, and they must show up rather than vanish.
 */
function extraNotes(result: object, known: Set<string>): string[] {
  const out: string[] = [];
  for (const [key, value] of Object.entries(result)) {
    if (known.has(key) || value === null || value === undefined || value === false) continue;
    if (Array.isArray(value)) {
      for (const v of value) out.push(`${words(key)}: ${noteText(v) ?? JSON.stringify(v)}`);
    } else if (value === true) out.push(words(key));
    else {
      const text = noteText(value);
      out.push(`${words(key)}: ${text ?? JSON.stringify(value)}`);
    }
  }
  return out;
}

function codeOf(lot: string | null | undefined): string {
  if (!lot) return '(no valid lot code)';
  try {
    return formatLotCode(lot);
  } catch {
    return lot;
  }
}

function problemOf(f: { seq?: unknown; reason?: unknown; message?: unknown }): RollProblem {
  return {
    seq: typeof f.seq === 'number' ? f.seq : null,
    reason: String(f.reason),
    message: String(f.message ?? ''),
  };
}

function uncheckedOf(value: unknown): UncheckedLine[] {
  if (!Array.isArray(value)) return [];
  return value.map((u: { seq?: unknown; message?: unknown }) => ({
    seq: typeof u?.seq === 'number' ? u.seq : null,
    message: typeof u?.message === 'string' ? u.message : JSON.stringify(u),
  }));
}

/** Turns core's bundle verification into a report. */
export function reportVerification(result: BundleVerification): Report {
  const rolls: RollLine[] = result.rolls.map((r) => ({
    lot: r.lot,
    code: codeOf(r.lot),
    scope: r.scope,
    ok: r.ok,
    entries: r.entries,
    status: r.state ? r.state.status : null,
    problem: r.failure ? problemOf(r.failure) : null,
    unchecked: r.ok ? uncheckedOf((r as { unchecked?: unknown }).unchecked) : [],
    notes: extraNotes(r, ROLL_KEYS),
  }));
  const key = (f: { lot?: unknown; seq?: unknown; reason?: unknown }) => `${f.lot}/${f.seq}/${f.reason}`;
  const attached = new Set(result.rolls.flatMap((r) => (r.failure ? [key(r.failure)] : [])));
  const problems = result.failures.filter((f) => !attached.has(key(f))).map(problemOf);
  const failures = result.failures.map((f) => ({ ...problemOf(f), lot: f.lot ?? null }));
  const ok = result.ok && rolls.every((r) => r.ok) && problems.length === 0;
  const notes = extraNotes(result, RESULT_KEYS);
  const partial = rolls.filter((r) => r.unchecked.length > 0).length;
  const noted = notes.length + rolls.reduce((n, r) => n + r.notes.length, 0);
  const first = failures[0];
  let headline = 'verified: every roll is unbroken and every link checks both ways';
  if (partial > 0)
    headline += `; ${plural(partial, 'roll')} ${partial === 1 ? 'is' : 'are'} not fully checkable after a removal`;
  if (noted > 0) headline += `; ${plural(noted, 'note')} above`;
  return {
    exitCode: ok ? 0 : 1,
    headline: ok ? headline : first ? brokenLine(first) : 'broken',
    summary: `${plural(rolls.length, 'lot')}, ${plural(result.entries, 'entry', 'entries')}, ${plural(result.links, 'cross-lot link')}`,
    rolls,
    problems,
    failures,
    notes,
    unreadable: null,
    checkpoints: [],
    uncheckedCheckpoints: 0,
  };
}

/**
 * Adds the check of the bundle's log checkpoints (§14.5) to a report of its rolls: with the log's
 * key, every checkpoint's signature and inclusion proofs, a failure making the report broken;
 * without one, only how many were left unchecked.
 */
function withCheckpoints(report: Report, bundle: Bundle, logKey: VerifierKey | undefined): Report {
  const members = bundle.checkpoints as unknown[];
  if (!logKey) return { ...report, uncheckedCheckpoints: members.length };
  const checkpoints = members.map((m): CheckpointLine => {
    const r = verifyBundleCheckpoint(m, bundle.rolls, logKey);
    return {
      ok: r.ok,
      size: r.checkpoint?.size ?? null,
      message: r.message ?? null,
      inclusions: r.inclusions.map((i) => ({
        code: codeOf(i.lot),
        seq: i.seq,
        logIndex: i.logIndex,
        ok: i.ok,
        message: i.message ?? null,
      })),
    };
  });
  const bad = checkpoints.find((c) => !c.ok);
  if (!bad) return { ...report, checkpoints };
  const wrong = bad.inclusions.find((i) => !i.ok);
  const why = wrong
    ? `lot ${wrong.code} seq ${wrong.seq} is not shown in the log at index ${wrong.logIndex} (${wrong.message})`
    : `its signature does not check with the log's key (${bad.message})`;
  return {
    ...report,
    checkpoints,
    exitCode: report.exitCode === 0 ? 1 : report.exitCode,
    headline: report.exitCode === 0 ? `broken: a checkpoint of the public log: ${why}` : report.headline,
  };
}

function brokenLine(f: RollProblem & { lot: string | null }): string {
  return `broken: lot ${codeOf(f.lot)}${f.seq === null ? '' : ` seq ${f.seq}`} (${f.reason})`;
}

/** A report for a file that is not a bundle at all. */
export function unreadableReport(code: string, message: string): Report {
  return {
    exitCode: 2,
    headline: `not a readable bundle (${code}): ${message}`,
    summary: null,
    rolls: [],
    problems: [],
    failures: [],
    notes: [],
    unreadable: { code, message },
    checkpoints: [],
    uncheckedCheckpoints: 0,
  };
}

/**
 * Checks the bytes of a file with core: the size limit, strict UTF-8, JSON and the bundle's
 * shape (exit 2 when any of these fail), then every roll and link, and with the log's key
 * (`logKey`) its log checkpoints (exit 0 or 1). Never throws.
 */
export function reportBundleBytes(
  bytes: Uint8Array,
  maxBytes = DEFAULT_MAX_BUNDLE_BYTES,
  logKey?: VerifierKey,
): Report {
  return reportParsed(() => parseBundleBytes(bytes, maxBytes), logKey);
}

/** Like {@link reportBundleBytes}, for text already decoded. Never throws. */
export function reportBundleText(
  text: string,
  maxBytes = DEFAULT_MAX_BUNDLE_BYTES,
  logKey?: VerifierKey,
): Report {
  return reportParsed(() => parseBundleText(text, maxBytes), logKey);
}

function reportParsed(parse: () => Bundle, logKey: VerifierKey | undefined): Report {
  let bundle: Bundle;
  let result: BundleVerification;
  try {
    bundle = parse();
    result = verifyBundle(bundle);
  } catch (e) {
    if (e instanceof BundleError) return unreadableReport(e.code, e.message);
    return unreadableReport('not-a-bundle', e instanceof Error ? e.message : String(e));
  }
  return withCheckpoints(reportVerification(result), bundle, logKey);
}

/** The report as lines of plain text, as the command line prints it. */
export function reportLines(report: Report): string[] {
  if (report.unreadable) return [report.headline];
  const out: string[] = [];
  if (report.summary) out.push(report.summary);
  const width = Math.max(0, ...report.rolls.map((r) => r.code.length));
  for (const r of report.rolls) {
    const what = r.scope === 'link' ? 'link entries only' : plural(r.entries, 'entry', 'entries');
    const name = r.code.padEnd(width);
    if (!r.ok && r.problem)
      out.push(
        `  ${name}  BROKEN   ${r.problem.seq === null ? '' : `at seq ${r.problem.seq}: `}${r.problem.reason} — ${r.problem.message}`,
      );
    else if (!r.ok) out.push(`  ${name}  BROKEN`);
    else if (r.unchecked.length > 0) {
      out.push(`  ${name}  intact, not fully checkable after a removal   (${what})`);
      for (const u of r.unchecked)
        out.push(`      ${u.seq === null ? '' : `seq ${u.seq}: `}could not check ${u.message}`);
    } else out.push(`  ${name}  intact   (${what}${r.status ? `, ${r.status}` : ''})`);
    for (const n of r.notes) out.push(`      note: ${n}`);
  }
  for (const p of report.problems)
    out.push(`  bundle  BROKEN   ${p.seq === null ? '' : `at seq ${p.seq}: `}${p.reason} — ${p.message}`);
  for (const n of report.notes) out.push(`  note: ${n}`);
  for (const c of report.checkpoints) {
    if (c.size === null) out.push(`  checkpoint  BROKEN   ${c.message ?? 'its signature does not check'}`);
    else
      out.push(`  checkpoint of ${plural(c.size, 'entry', 'entries')}  signature checks with the log's key`);
    for (const i of c.inclusions)
      out.push(
        `      lot ${i.code} seq ${i.seq} at log index ${i.logIndex}: ${i.ok ? 'in the log' : `NOT SHOWN IN THE LOG — ${i.message}`}`,
      );
  }
  if (report.uncheckedCheckpoints > 0)
    out.push(
      `  ${plural(report.uncheckedCheckpoints, 'checkpoint')} of the public log not checked: give the log's key with --log-key`,
    );
  if (report.exitCode === 0) out.push(report.headline);
  else if (report.failures.length === 0) out.push(report.headline);
  else for (const f of report.failures) out.push(brokenLine(f));
  return out;
}
