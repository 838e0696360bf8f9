import { formatLotCode, type RollState } from '@beadroll/core';
import { QueryClientProvider, useQuery, type QueryClient } from '@tanstack/react-query';
import { lazy, Suspense, useEffect, useMemo, useState, type ReactNode } from 'react';
import { createQueryClient } from '../../lib/query-client';
import { Ancestry } from './Ancestry';
import { brandVars } from './brand-vars';
import { checkLot, checkTag, type LotCheck } from './check-lot';
import { exhibitsOf, Gallery } from './Gallery';
import { HandlingCautions } from './HandlingCautions';
import { Inherited, ObservationSummary, observationRecords } from './Inherited';
import { HolderCard, LotFacts } from './LotFacts';
import { NotFound } from './NotFound';
import { OnRecord } from './OnRecord';
import { Opinions } from './Opinions';
import {
  publicLotQuery,
  type DealerCard,
  type PublicLotResponse,
  type PublicLotResult,
} from './public-lot.api';
import { parsePublicPath } from './route';
import { StatusPanel } from './StatusPanel';
import { Timeline } from './Timeline';
import { buildTimeline } from './timeline';
import { VerifyYourself } from './VerifyYourself';
import { countWords, FORM_WORDS, STATUS_WORDS } from './words';
import './public-lot.css';

// Loaded after the page's own check: the log check (signatures and proofs) and the report form
// are not needed to show the history and its verification, so the buyer does not wait for them.
const LogPanel = lazy(() => import('../transparency/LogPanel').then((m) => ({ default: m.LogPanel })));
const ReportProblem = lazy(() =>
  import('../registry/ReportProblem').then((m) => ({ default: m.ReportProblem })),
);

/**
 * The public history page for the address `pathname` (`/l/{code}` or `/L/{code}/{H}`). `data` is
 * the lot's public data when the server sent it with the page (checked exactly as the API's
 * answer would be); otherwise the page fetches it. `prerender`: the server's rendering of the
 * page, which shows the history as served and leaves the check to the browser (no verdict, no
 * log check).
 */
export function PublicLotApp({
  pathname,
  client,
  data,
  prerender = false,
}: {
  pathname: string;
  client?: QueryClient;
  data?: PublicLotResponse | null;
  prerender?: boolean;
}) {
  const route = parsePublicPath(pathname);
  const [qc] = useState(() => {
    const qc = client ?? createQueryClient();
    if (route && data && data.code === route.code) {
      const seeded: PublicLotResult = { found: true, data };
      qc.setQueryData(publicLotQuery(route.code).queryKey, seeded);
    }
    return qc;
  });
  return (
    <QueryClientProvider client={qc}>
      <Frame>
        {route ? <LotPage code={route.code} tagRef={route.tagRef} prerender={prerender} /> : <NotFound />}
      </Frame>
    </QueryClientProvider>
  );
}

function Frame({ children }: { children: ReactNode }) {
  return (
    <div className="pl" style={brandVars}>
      <header className="pl-top">
        <span className="pl-brand">Beadroll</span>
        <span className="pl-top-what">public lot history</span>
      </header>
      <main className="pl-main">{children}</main>
      <footer className="pl-foot">
        <p>
          Beadroll keeps the history of lots of glass beads as dealers record it. This page checked it in your
          browser; nothing you type here is sent anywhere, except a report you choose to send.
        </p>
      </footer>
    </div>
  );
}

function LotPage({ code, tagRef, prerender }: { code: string; tagRef: string | null; prerender: boolean }) {
  const q = useQuery(publicLotQuery(code));
  const data = q.data?.found ? q.data.data : null;
  const savedCopy = q.data?.found ? q.data.savedCopy : undefined;
  const check = useMemo<LotCheck | null>(
    () => (data ? checkLot(code, data.code === code ? data.bundle : null) : null),
    [code, data],
  );
  const title = check?.ok ? check.state.description?.title : undefined;
  useEffect(() => {
    document.title = `${title ?? `Lot ${formatLotCode(code)}`} · Beadroll`;
  }, [title, code]);

  if (q.data && !q.data.found) return <NotFound />;
  const cards = data?.cards ?? {};
  return (
    <>
      <div className="pl-top-grid">
        <div className="pl-intro">
          <p className="pl-code">Lot {formatLotCode(code)}</p>
          <h1>{title ?? (check && !check.ok ? 'History that does not check out' : 'Lot history')}</h1>
          {check?.ok && <Subtitle state={check.state} />}
          {check?.ok && <OnRecord record={check.record} cards={cards} inherited={check.inherited} />}
        </div>
        <div className="pl-side">
          <StatusPanel
            check={prerender ? null : check}
            loading={q.isPending}
            prerendered={prerender}
            tagRef={tagRef}
            savedCopy={savedCopy}
          />
          {check?.ok &&
            data &&
            (prerender ? (
              <LogPending />
            ) : savedCopy ? (
              <LogWaitsForSignal />
            ) : (
              <Suspense fallback={<LogPending />}>
                <LogPanel code={code} bundle={data.bundle} />
              </Suspense>
            ))}
          {check?.ok && <HolderCard state={check.state} cards={cards} />}
          {check?.ok && <LotFacts state={check.state} />}
          {check?.ok && <HandlingCautions entries={check.entries} />}
        </div>
        {q.isError && (
          <div className="pl-card pl-error" role="alert">
            <p>The history could not be loaded. Check the connection and try again.</p>
            <button type="button" onClick={() => void q.refetch()}>
              Try again
            </button>
          </div>
        )}
        {check?.ok && exhibitsOf(check.entries).length > 0 && (
          <div className="pl-lead">
            <Gallery code={code} exhibits={exhibitsOf(check.entries)} cards={cards} />
          </div>
        )}
      </div>
      {check && <Body check={check} cards={cards} tagRef={tagRef} />}
      {data && !prerender && (
        <Suspense fallback={null}>
          <ReportProblem code={code} />
        </Suspense>
      )}
    </>
  );
}

/** The log panel's place while its code loads, in the words it starts with. */
function LogPending() {
  return (
    <section className="pl-card pl-log" aria-labelledby="pl-log-h">
      <h2 id="pl-log-h" className="pl-visually-hidden">
        Public log
      </h2>
      <p className="pl-status-line">Checking the registry’s public log…</p>
    </section>
  );
}

/** With no signal the registry's public log cannot be asked: said plainly, not as a failure. */
function LogWaitsForSignal() {
  return (
    <section className="pl-card pl-log" aria-labelledby="pl-log-h">
      <h2 id="pl-log-h" className="pl-visually-hidden">
        Public log
      </h2>
      <p className="pl-status-line">The registry’s public log is checked when there is a signal.</p>
      <p className="pl-status-sub">
        The history above was checked in this browser on its own; the log check needs the registry’s newest
        checkpoint.
      </p>
    </section>
  );
}

function Subtitle({ state }: { state: RollState }) {
  const d = state.description;
  const parts = [d ? FORM_WORDS[d.form] : null, d ? countWords(d.count) : null, STATUS_WORDS[state.status]];
  return <p className="pl-subtitle">{parts.filter(Boolean).join(' · ')}</p>;
}

function Body({
  check,
  cards,
  tagRef,
}: {
  check: LotCheck;
  cards: Record<string, DealerCard>;
  tagRef: string | null;
}) {
  const items = useMemo(() => buildTimeline(check.entries, cards), [check, cards]);
  const tag = tagRef ? checkTag(check.entries, tagRef) : null;
  const tagSeq = tag?.state === 'matches' ? tag.seq : null;
  if (!check.ok) {
    return (
      <div className="pl-body">
        <div className="pl-col">
          {items.length > 0 && (
            <Timeline
              items={items}
              tagSeq={tagSeq}
              heading={`The ${items.length} ${items.length === 1 ? 'entry' : 'entries'} before the break`}
            />
          )}
        </div>
        <VerifyYourself code={check.code} head={null} />
      </div>
    );
  }
  return (
    <div className="pl-body">
      <div className="pl-col">
        <Opinions state={check.state} record={check.record} inherited={check.inherited} cards={cards} />
        <Inherited code={check.code} inherited={check.inherited} ancestors={check.ancestors} cards={cards} />
        <Ancestry state={check.state} ancestors={check.ancestors} />
      </div>
      <div className="pl-col">
        {observationRecords(check.entries).length > 0 && (
          <section className="pl-section" aria-labelledby="pl-obs-now">
            <ObservationSummary
              records={observationRecords(check.entries)}
              cards={cards}
              heading="What the holder records now"
              id="pl-obs-now"
            />
          </section>
        )}
        <Timeline items={items} tagSeq={tagSeq} />
      </div>
      <VerifyYourself code={check.code} head={check.state.head} />
    </div>
  );
}
