import { formatLotCode } from '@beadroll/core';
import type { LotCheck } from './check-lot';
import { BREAK_WORDS, dateWords } from './words';

/** What the status panel says about a checked history: its line, mark and the sentence below. */
export interface HistoryWords {
  tone: 'ok' | 'warn' | 'bad';
  mark: '✓' | '!' | '✗';
  line: string;
  sub: string;
  /** The verifier's reason code, shown before `sub` when the history breaks. */
  reason?: string;
}

/** The words for the result of {@link checkLot}, the same wherever the page shows them. */
export function historyWords(check: LotCheck): HistoryWords {
  if (check.ok && check.unchecked.length > 0) {
    const first = check.unchecked[0]!;
    const rules = check.unchecked.length === 1 ? 'one rule' : `${check.unchecked.length} rules`;
    return {
      tone: 'warn',
      mark: '!',
      line: 'Unbroken, but not fully checkable after a removal',
      sub: `Every fingerprint and link checks out, but the registrar removed an old entry's contents, and ${rules} of this older history could not be checked without them (entry ${first.seq}: ${first.message}).`,
    };
  }
  if (check.ok) {
    const n = check.entries.length;
    const more = check.bundleEntries - n;
    const linked =
      more > 0 ? `, with ${more} linked ${more === 1 ? 'entry' : 'entries'} of the lots it came from` : '';
    return {
      tone: 'ok',
      mark: '✓',
      line: `Unbroken history as served: ${n} ${n === 1 ? 'entry' : 'entries'}`,
      sub: `Every fingerprint and link was recomputed in this browser${linked}.`,
    };
  }
  const f = check.failure;
  const why = f.reason in BREAK_WORDS ? BREAK_WORDS[f.reason as keyof typeof BREAK_WORDS] : f.message;
  const where =
    f.reason === 'not-a-bundle' || f.reason === 'no-roll'
      ? 'The data served is not a readable history of this lot.'
      : f.lot && f.lot !== check.code
        ? `History broken in linked lot ${formatLotCode(f.lot)} at entry ${f.seq}: ${why}.`
        : `History broken at entry ${f.seq} of ${check.total}${f.at ? ` (${f.at.kind}, ${dateWords(f.at.time)})` : ''}: ${why}.`;
  return {
    tone: 'bad',
    mark: '✗',
    line: where,
    reason: f.reason,
    sub: 'Nothing from the break on is shown; the entries before it are listed as served.',
  };
}

/**
 * Writes the status panel's history line into a page whose markup came from the server, as
 * soon as this browser has checked the history, before the rest of the page's script has
 * arrived. Preconditions: `live` is the panel's live region; `check` was computed in this
 * browser by {@link checkLot}. The page's own rendering replaces it with the same words later.
 */
export function writeHistoryLine(live: Element, check: LotCheck): void {
  const doc = live.ownerDocument;
  const w = historyWords(check);
  const el = (tag: string, className: string | null, ...kids: (Node | string)[]) => {
    const e = doc.createElement(tag);
    if (className) e.className = className;
    e.append(...kids);
    return e;
  };
  const mark = el('span', 'pl-mark', w.mark);
  mark.setAttribute('aria-hidden', 'true');
  const sub =
    w.reason === undefined
      ? el('p', 'pl-status-sub', w.sub)
      : el('p', 'pl-status-sub', 'Reason code ', el('code', null, w.reason), `. ${w.sub}`);
  live.replaceChildren(el('p', `pl-status-line pl-${w.tone}`, mark, ` ${w.line}`), sub);
}
