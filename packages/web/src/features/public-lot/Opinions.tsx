import type { AttributionOnRecord, InheritedEntry, RollState, WeighedOpinion } from '@beadroll/core';
import { ConsensusChart, roleWords, type ChartOpinion, type OpinionRole } from './ConsensusChart';
import type { DealerCard } from './public-lot.api';
import { authorWords, whereWords } from './record-words';
import { nameOf } from './timeline';
import {
  CONFIDENCE_WORDS,
  dateWords,
  ORIGIN_WORDS,
  periodWords,
  QUALIFIER_WORDS,
  TECHNIQUE_WORDS,
} from './words';

/**
 * The attribution on record, every dissent and every agreeing opinion, on this lot and on the
 * lots its beads came from, and the chart of them all.
 */
export function Opinions({
  state,
  record,
  inherited,
  cards,
}: {
  state: RollState;
  record: AttributionOnRecord;
  inherited: readonly InheritedEntry[];
  cards: Record<string, DealerCard>;
}) {
  const name = (a: string) => nameOf(cards, a);
  const rec = record.record;
  const others = record.opinions.filter(
    (o) => o !== rec && !record.agree.includes(o) && !record.dissent.includes(o),
  );
  const chart: ChartOpinion[] = record.opinions.map((o, i) => ({
    seq: i,
    author: o.author,
    body: o.body,
    role: o === rec ? 'attribution' : record.dissent.includes(o) ? 'dissent' : 'other',
  }));
  const removed = state.opinions.filter((o) => !o.body);
  const card = (o: WeighedOpinion, role: OpinionRole | 'agree') => (
    <li key={`${o.lot}/${o.seq}`}>
      <OpinionCard
        opinion={o}
        role={role}
        author={authorWords(cards, o.author)}
        where={whereWords(o, inherited)}
        adopted={o === rec && record.adopted ? record.adopted : null}
        cards={cards}
      />
    </li>
  );
  return (
    <section className="pl-section" aria-labelledby="pl-op-h">
      <h2 id="pl-op-h">Attribution and opinions</h2>
      <h3 id="pl-op-record" className="pl-op-group">
        Attribution on record
      </h3>
      {rec ? (
        <ul className="pl-opinions">{card(rec, 'attribution')}</ul>
      ) : (
        <p>No holder has recorded one yet.</p>
      )}
      <h3 id="pl-op-dissent" className="pl-op-group">
        {record.dissent.length === 1 ? '1 dissent' : `${record.dissent.length} dissents`}
      </h3>
      {record.dissent.length > 0 ? (
        <ul className="pl-opinions">{record.dissent.map((o) => card(o, 'dissent'))}</ul>
      ) : (
        <p>{rec ? 'No opinion disagrees with the attribution on record.' : 'Nothing to dissent from yet.'}</p>
      )}
      <h3 id="pl-op-agree" className="pl-op-group">
        {record.agree.length === 1 ? '1 opinion agrees' : `${record.agree.length} opinions agree`}
      </h3>
      {record.agree.length > 0 ? (
        <ul className="pl-opinions">{record.agree.map((o) => card(o, 'agree'))}</ul>
      ) : (
        <p>None besides the attribution itself.</p>
      )}
      {others.length > 0 && (
        <>
          <h3 className="pl-op-group">Other opinions</h3>
          <ul className="pl-opinions">{others.map((o) => card(o, 'other'))}</ul>
        </>
      )}
      {removed.length > 0 && (
        <p className="pl-hint">
          The registrar removed the contents of {removed.length}{' '}
          {removed.length === 1 ? 'opinion' : 'opinions'} (entry {removed.map((o) => o.seq).join(', ')}); they
          no longer count.
        </p>
      )}
      {chart.length > 0 && <ConsensusChart opinions={chart} nameOf={name} />}
      <p className="pl-hint">
        Opinions are recorded as their authors gave them, on this lot or on the lots its beads came from. The
        checks on this page show who recorded what and when, not that an attribution is right: it is not an
        authentication. Ask a specialist before relying on one, and follow local consumer-protection rules on
        describing goods as antique.
      </p>
    </section>
  );
}

function OpinionCard({
  opinion,
  role,
  author,
  where,
  adopted,
  cards,
}: {
  opinion: WeighedOpinion;
  role: OpinionRole | 'agree';
  author: string;
  where: string;
  adopted: WeighedOpinion | null;
  cards: Record<string, DealerCard>;
}) {
  const o = opinion.body;
  const label = role === 'agree' ? 'Agrees' : roleWords(role);
  return (
    <article className={`pl-opinion pl-opinion-${role}`} aria-label={`${label} by ${author}`}>
      <p className="pl-opinion-role">{label}</p>
      <p className="pl-opinion-head">
        {ORIGIN_WORDS[o.origin].charAt(0).toUpperCase() + ORIGIN_WORDS[o.origin].slice(1)}
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
      {adopted && (
        <p className="pl-opinion-adopts">
          Adopts the attribution {adopted.byHolder ? 'of the earlier holder' : 'of'}{' '}
          {authorWords(cards, adopted.author)}, recorded {dateWords(adopted.time)}.
        </p>
      )}
      <p className="pl-opinion-by">
        by {author} · {dateWords(opinion.time)} · {where} · entry {opinion.seq}
        {opinion.byHolder ? ' · recorded by the holder at the time' : ''}
      </p>
    </article>
  );
}
