import type { OpinionRecord, RollState } from '@beadroll/core';
import { ConsensusChart, roleWords, type ChartOpinion, type OpinionRole } from './ConsensusChart';
import type { DealerCard } from './public-lot.api';
import { nameOf } from './timeline';
import {
  CONFIDENCE_WORDS,
  dateWords,
  ORIGIN_WORDS,
  periodWords,
  QUALIFIER_WORDS,
  TECHNIQUE_WORDS,
} from './words';

function roleOf(state: RollState, o: OpinionRecord): OpinionRole {
  if (state.attribution?.seq === o.seq) return 'attribution';
  if (state.dissents.some((d) => d.seq === o.seq)) return 'dissent';
  return 'other';
}

/** The holder's attribution, every dissent and other standing opinion, and the chart. */
export function Opinions({ state, cards }: { state: RollState; cards: Record<string, DealerCard> }) {
  const name = (a: string) => nameOf(cards, a);
  const withBody: ChartOpinion[] = state.opinions
    .filter((o) => o.body)
    .map((o) => ({ seq: o.seq, author: o.author, body: o.body!, role: roleOf(state, o) }));
  const order: OpinionRole[] = ['attribution', 'dissent', 'other'];
  const listed = [...state.opinions].sort(
    (a, b) => order.indexOf(roleOf(state, a)) - order.indexOf(roleOf(state, b)) || a.seq - b.seq,
  );
  return (
    <section className="pl-section" aria-labelledby="pl-op-h">
      <h2 id="pl-op-h">Attribution and opinions</h2>
      {!state.attribution && <p>No attribution by the holder yet.</p>}
      {state.dissents.length > 0 && (
        <p className="pl-dissent-count">
          {state.dissents.length} {state.dissents.length === 1 ? 'dissent' : 'dissents'} from the holder’s
          attribution.
        </p>
      )}
      {withBody.length > 0 && <ConsensusChart opinions={withBody} nameOf={name} />}
      <ul className="pl-opinions">
        {listed.map((o) => (
          <li key={o.seq}>
            <OpinionCard record={o} role={roleOf(state, o)} author={name(o.author)} />
          </li>
        ))}
      </ul>
      <p className="pl-hint">
        Opinions are recorded as their authors gave them. The checks on this page show who recorded what and
        when, not that an attribution is right: it is not an authentication. Ask a specialist before relying
        on one, and follow local consumer-protection rules on describing goods as antique.
      </p>
    </section>
  );
}

function OpinionCard({ record, role, author }: { record: OpinionRecord; role: OpinionRole; author: string }) {
  const o = record.body;
  return (
    <article className={`pl-opinion pl-opinion-${role}`} aria-label={`${roleWords(role)} by ${author}`}>
      <p className="pl-opinion-role">{roleWords(role)}</p>
      {o ? (
        <>
          <p className="pl-opinion-head">
            {ORIGIN_WORDS[o.origin]}
            {o.originNote ? ` (${o.originNote})` : ''}, {periodWords(o.period)}
          </p>
          <p className="pl-opinion-facts">
            {QUALIFIER_WORDS[o.qualifier]} · {TECHNIQUE_WORDS[o.technique]} · {CONFIDENCE_WORDS[o.confidence]}
            {o.exhibits.length > 0
              ? ` · cites ${o.exhibits.length} ${o.exhibits.length === 1 ? 'exhibit' : 'exhibits'}`
              : ''}
          </p>
          {o.decoration && <p>Decoration: {o.decoration}</p>}
          <p className="pl-opinion-why">{o.rationale}</p>
        </>
      ) : (
        <p>The contents of this opinion were removed by the registrar.</p>
      )}
      <p className="pl-opinion-by">
        by {author} · {dateWords(record.time)} · entry {record.seq}
      </p>
    </article>
  );
}
