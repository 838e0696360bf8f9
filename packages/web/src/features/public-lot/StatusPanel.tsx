import { useId, useState, type FormEvent } from 'react';
import { dateWords, BREAK_WORDS } from './words';
import { checkTag, type LotCheck, type TagCheck } from './check-lot';
import { formatLotCode } from '@beadroll/core';
import type { SavedCopy } from './public-lot.api';

/** The verification status, announced to screen readers whenever it changes. */
export function StatusPanel({
  check,
  loading,
  tagRef,
  savedCopy,
}: {
  check: LotCheck | null;
  loading: boolean;
  tagRef: string | null;
  /** Set when the data is the copy this browser kept, shown with no signal. */
  savedCopy?: SavedCopy;
}) {
  const [typed, setTyped] = useState<{ text: string; result: TagCheck } | null>(null);
  const fromAddress = check && tagRef ? checkTag(check.entries, tagRef) : null;
  const tag = fromAddress ?? typed?.result ?? null;
  return (
    <section
      className={`pl-card pl-status${check && !check.ok ? ' pl-status-broken' : ''}`}
      aria-labelledby="pl-status-h"
    >
      <h2 id="pl-status-h" className="pl-visually-hidden">
        Verification
      </h2>
      <div role="status" aria-live="polite" aria-atomic="true" className="pl-status-live">
        {loading && <p className="pl-status-line">Fetching the history and checking it in this browser…</p>}
        {check && savedCopy && <SavedCopyLine savedCopy={savedCopy} ok={check.ok} />}
        {check && <HistoryLine check={check} />}
        {check && tag && <TagLine tag={tag} broken={!check.ok} typed={!fromAddress} />}
      </div>
      {check && !tagRef && <TagBox onCheck={(text, result) => setTyped({ text, result })} check={check} />}
    </section>
  );
}

/** When a phone last got this copy, in its own time zone: "5 Dec 2026, 14:32". */
export function savedAtWords(at: Date | null, locale?: string): string {
  if (!at) return 'an earlier visit';
  return new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle: 'short' }).format(at);
}

function SavedCopyLine({ savedCopy, ok }: { savedCopy: SavedCopy; ok: boolean }) {
  const when = savedAtWords(savedCopy.at);
  return (
    <div className="pl-offline">
      <p className="pl-offline-line">
        {ok ? `offline: as verified at ${when}` : `offline: the copy kept at ${when} no longer verifies`}
      </p>
      <p className="pl-status-sub">
        No signal: this is the copy this phone kept when the page was last opened
        {ok
          ? '. Its history was checked again just now, in this browser; newer entries show once the signal returns.'
          : '. It was checked again just now, in this browser, and it does not check out; do not rely on it.'}
      </p>
    </div>
  );
}

function HistoryLine({ check }: { check: LotCheck }) {
  if (check.ok && check.unchecked.length > 0) {
    const first = check.unchecked[0]!;
    return (
      <>
        <p className="pl-status-line pl-warn">
          <span aria-hidden="true" className="pl-mark">
            !
          </span>{' '}
          Unbroken, but not fully checkable after a removal
        </p>
        <p className="pl-status-sub">
          Every fingerprint and link checks out, but the registrar removed an old entry's contents, and{' '}
          {check.unchecked.length === 1 ? 'one rule' : `${check.unchecked.length} rules`} of this older
          history could not be checked without them (entry {first.seq}: {first.message}).
        </p>
      </>
    );
  }
  if (check.ok) {
    const n = check.entries.length;
    const more = check.bundleEntries - n;
    return (
      <>
        <p className="pl-status-line pl-ok">
          <span aria-hidden="true" className="pl-mark">
            ✓
          </span>{' '}
          Unbroken history as served: {n} {n === 1 ? 'entry' : 'entries'}
        </p>
        <p className="pl-status-sub">
          Every fingerprint and link was recomputed in this browser
          {more > 0
            ? `, with ${more} linked ${more === 1 ? 'entry' : 'entries'} of the lots it came from`
            : ''}
          .
        </p>
      </>
    );
  }
  const f = check.failure;
  const why = f.reason in BREAK_WORDS ? BREAK_WORDS[f.reason as keyof typeof BREAK_WORDS] : f.message;
  const where =
    f.reason === 'not-a-bundle' || f.reason === 'no-roll'
      ? 'The data served is not a readable history of this lot.'
      : f.lot && f.lot !== check.code
        ? `History broken in linked lot ${formatLotCode(f.lot)} at entry ${f.seq}: ${why}.`
        : `History broken at entry ${f.seq} of ${check.total}${f.at ? ` (${f.at.kind}, ${dateWords(f.at.time)})` : ''}: ${why}.`;
  return (
    <>
      <p className="pl-status-line pl-bad">
        <span aria-hidden="true" className="pl-mark">
          ✗
        </span>{' '}
        {where}
      </p>
      <p className="pl-status-sub">
        Reason code <code>{f.reason}</code>. Nothing from the break on is shown; the entries before it are
        listed as served.
      </p>
    </>
  );
}

function TagLine({ tag, broken, typed }: { tag: TagCheck; broken: boolean; typed: boolean }) {
  const source = typed ? 'The code you typed' : 'This tag';
  if (tag.state === 'matches') {
    return (
      <p className={`pl-status-line ${broken ? 'pl-warn' : 'pl-ok'}`}>
        <span aria-hidden="true" className="pl-mark">
          {broken ? '!' : '✓'}
        </span>{' '}
        {typed ? 'The code you typed matches' : 'This tag matches'} entry {tag.seq};{' '}
        {tag.since === 0
          ? 'no entries added since'
          : `${tag.since} ${tag.since === 1 ? 'entry' : 'entries'} added since`}
        {broken ? ', but the history after it does not check out' : ''}.
      </p>
    );
  }
  if (tag.state === 'typing-error') {
    return (
      <p className="pl-status-line pl-warn">
        <span aria-hidden="true" className="pl-mark">
          !
        </span>{' '}
        {typed
          ? 'This code has a typing error; compare it with the tag again.'
          : 'The code in this address has a typing error; compare it with the tag again.'}
      </p>
    );
  }
  if (tag.state === 'unreadable') {
    return (
      <p className="pl-status-line pl-warn">
        <span aria-hidden="true" className="pl-mark">
          !
        </span>{' '}
        {source} carries a reference this page cannot read, so it cannot be checked.
      </p>
    );
  }
  return (
    <p className="pl-status-line pl-warn">
      <span aria-hidden="true" className="pl-mark">
        !
      </span>{' '}
      Warning: this history no longer contains the entry{' '}
      {typed ? 'that code names' : 'this tag was printed from'}. The history may have been rewritten, or the
      tag belongs to another copy of it. Ask the dealer.
    </p>
  );
}

function TagBox({ check, onCheck }: { check: LotCheck; onCheck: (text: string, r: TagCheck) => void }) {
  const id = useId();
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const result = checkTag(check.entries, text);
    if (result.state === 'unreadable') {
      setError('Type the code printed on the tag, for example ABCDE-FGHJK-X (older tags: ABCDE-FGHJK).');
      return;
    }
    setError(null);
    onCheck(text, result);
  };
  return (
    <form className="pl-tagbox" onSubmit={submit} noValidate>
      <label htmlFor={`${id}-in`}>Check the code printed on the tag</label>
      <p id={`${id}-hint`} className="pl-hint">
        It is printed beside the QR code, like <span className="pl-nowrap">entry 12 · ABCDE-FGHJK-X</span>.
        Letter case, spaces and dashes do not matter.
      </p>
      <div className="pl-tagbox-row">
        <input
          id={`${id}-in`}
          name="tag"
          autoComplete="off"
          autoCapitalize="characters"
          spellCheck={false}
          value={text}
          onChange={(e) => setText(e.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={`${id}-hint${error ? ` ${id}-err` : ''}`}
        />
        <button type="submit">Check tag</button>
      </div>
      {error && (
        <p id={`${id}-err`} className="pl-field-error">
          {error}
        </p>
      )}
    </form>
  );
}
