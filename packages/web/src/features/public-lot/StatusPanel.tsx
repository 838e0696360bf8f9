import { useId, useState, type FormEvent } from 'react';
import { checkTag, type LotCheck, type TagCheck } from './check-lot';
import { historyWords } from './history-words';
import type { SavedCopy } from './public-lot.api';

/** The verification status, announced to screen readers whenever it changes. */
export function StatusPanel({
  check,
  loading,
  tagRef,
  savedCopy,
  prerendered = false,
}: {
  check: LotCheck | null;
  loading: boolean;
  tagRef: string | null;
  /** Set when the data is the copy this browser kept, shown with no signal. */
  savedCopy?: SavedCopy;
  /** The server's rendering: the history is on the page and is checked when the script runs. */
  prerendered?: boolean;
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
        {prerendered && <p className="pl-status-line">Checking this history in this browser…</p>}
        {loading && !prerendered && (
          <p className="pl-status-line">Fetching the history and checking it in this browser…</p>
        )}
        {check && savedCopy && <SavedCopyLine savedCopy={savedCopy} ok={check.ok} />}
        {check && <HistoryLine check={check} />}
        {check && tag && <TagLine tag={tag} broken={!check.ok} typed={!fromAddress} />}
      </div>
      {(check || prerendered) && !tagRef && (
        <TagBox onCheck={(text, result) => setTyped({ text, result })} check={check} />
      )}
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
  const w = historyWords(check);
  return (
    <>
      <p className={`pl-status-line pl-${w.tone}`}>
        <span aria-hidden="true" className="pl-mark">
          {w.mark}
        </span>{' '}
        {w.line}
      </p>
      {w.reason === undefined ? (
        <p className="pl-status-sub">{w.sub}</p>
      ) : (
        <p className="pl-status-sub">
          Reason code <code>{w.reason}</code>. {w.sub}
        </p>
      )}
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

function TagBox({
  check,
  onCheck,
}: {
  /** null until the history has been checked in this browser: nothing to compare with yet. */
  check: LotCheck | null;
  onCheck: (text: string, r: TagCheck) => void;
}) {
  const id = useId();
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!check) return;
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
