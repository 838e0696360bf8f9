import { type AttributionOnRecord, type InheritedEntry } from '@beadroll/core';
import type { DealerCard } from './public-lot.api';
import { recordWhoWords } from './record-words';
import { ORIGIN_WORDS, periodWords } from './words';

const capitalised = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * The first thing a buyer reads: the attribution on record and how many opinions agree and
 * dissent, each a link to the opinions further down. Kept above the verification panel so a
 * dissent is always on the first screen.
 */
export function OnRecord({
  record,
  cards,
  inherited,
}: {
  record: AttributionOnRecord;
  cards: Record<string, DealerCard>;
  inherited: readonly InheritedEntry[];
}) {
  const r = record.record;
  const agree = record.agree.length;
  const dissent = record.dissent.length;
  const others = record.opinions.length;
  return (
    <section className="pl-record" aria-labelledby="pl-record-h">
      <h2 id="pl-record-h" className="pl-record-label">
        Attribution on record
      </h2>
      {r ? (
        <>
          <p className="pl-record-what">
            <a href="#pl-op-record">
              {capitalised(ORIGIN_WORDS[r.body.origin])}
              {r.body.originNote ? ` (${r.body.originNote})` : ''}, {periodWords(r.body.period)}
            </a>
          </p>
          <p className="pl-record-who">{capitalised(recordWhoWords(record, cards, inherited))}.</p>
          <p className="pl-record-counts">
            <a href="#pl-op-agree" className="pl-count-agree">
              {agree} {agree === 1 ? 'opinion agrees' : 'opinions agree'}
            </a>
            <span aria-hidden="true"> · </span>
            <a href="#pl-op-dissent" className={dissent > 0 ? 'pl-count-dissent' : 'pl-count-agree'}>
              {dissent} {dissent === 1 ? 'dissent' : 'dissents'}
            </a>
          </p>
        </>
      ) : (
        <>
          <p className="pl-record-what">No holder has recorded an attribution yet.</p>
          {others > 0 && (
            <p className="pl-record-counts">
              <a href="#pl-op-h">
                {others} {others === 1 ? 'opinion' : 'opinions'} by others
              </a>
            </p>
          )}
        </>
      )}
    </section>
  );
}
