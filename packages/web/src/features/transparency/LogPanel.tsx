import type { Bundle } from '@beadroll/core';
import { useQuery } from '@tanstack/react-query';
import { dateWords } from '../public-lot/words';
import { logCheckQuery } from './log.api';
import type { LogCheckDeps } from './log-check';

/** Whether this lot is in the registry's public log, checked in the browser (format §14.6). */
export function LogPanel({ code, bundle, deps }: { code: string; bundle: Bundle; deps?: LogCheckDeps }) {
  const q = useQuery(logCheckQuery(code, bundle, deps));
  const r = q.data;
  return (
    <section className="pl-card pl-log" aria-labelledby="pl-log-h">
      <h2 id="pl-log-h" className="pl-visually-hidden">
        Public log
      </h2>
      <div aria-live="polite" aria-atomic="true">
        {q.isPending && <p className="pl-status-line">Checking the registry’s public log…</p>}
        {q.isError && (
          <p className="pl-status-line pl-warn">The registry’s public log could not be checked.</p>
        )}
        {r?.state === 'not-yet' && (
          <>
            <p className="pl-status-line pl-warn">
              <span aria-hidden="true" className="pl-mark">
                !
              </span>{' '}
              Not yet in a signed checkpoint of the registry’s public log
            </p>
            <p className="pl-status-sub">
              The registry signs a new checkpoint a few seconds after each change.
            </p>
          </>
        )}
        {r?.state === 'in-log' && (
          <>
            <p className="pl-status-line pl-ok">
              <span aria-hidden="true" className="pl-mark">
                ✓
              </span>{' '}
              In the registry’s public log since {dateWords(r.since)}, checkpoint of {r.size}{' '}
              {r.size === 1 ? 'entry' : 'entries'}, witnessed by {r.witnesses}
            </p>
            <p className="pl-status-sub">
              The checkpoint’s signature and the proof that entry {r.seq} of this lot is in it were checked in
              this browser
              {r.seq !== r.headSeq ? ` (the newest entry, ${r.headSeq}, comes in the next checkpoint)` : ''}
              {r.rememberedSize !== null
                ? `, and the log agrees with the checkpoint of ${r.rememberedSize} entries this browser saw before`
                : ''}
              .
            </p>
          </>
        )}
        {r?.state === 'failed' && (
          <>
            <p className="pl-status-line pl-bad">
              <span aria-hidden="true" className="pl-mark">
                ✗
              </span>{' '}
              The registry’s public log check failed
            </p>
            <p className="pl-status-sub">{r.what}</p>
          </>
        )}
      </div>
    </section>
  );
}
