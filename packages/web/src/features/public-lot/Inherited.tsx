import {
  formatLotCode,
  type ExhibitAddedBody,
  type InheritedEntry,
  type ObservedBody,
  type Observations,
  type VerifiedEntry,
} from '@beadroll/core';
import { ExhibitList, type ShownExhibit } from './Gallery';
import type { AncestorView } from './check-lot';
import type { DealerCard } from './public-lot.api';
import { leftWords } from './record-words';
import { nameOf } from './timeline';
import { dateWords, observationPhrases } from './words';

/** One recorded set of observations: who, when, what. */
export interface ObservationRecord {
  seq: number;
  time: string;
  actor: string;
  observations: Observations;
}

/**
 * The observations as they stand now: for each clue the newest value recorded, and the note of
 * the newest entry that has one. `records` oldest first.
 */
export function currentObservations(records: readonly ObservationRecord[]): Observations {
  const now: Observations = {};
  for (const r of records) Object.assign(now, r.observations);
  return now;
}

/** Every `observed` entry with its body, oldest first. */
export function observationRecords(entries: readonly VerifiedEntry[]): ObservationRecord[] {
  return entries
    .filter((e) => e.header.kind === 'observed' && e.body)
    .map((e) => ({
      seq: e.header.seq,
      time: e.header.time,
      actor: e.header.actor,
      observations: (e.body as ObservedBody).observations,
    }));
}

/** The newest observations as one summary; the records they came from folded under it. */
export function ObservationSummary({
  records,
  cards,
  heading,
  id,
}: {
  records: readonly ObservationRecord[];
  cards: Record<string, DealerCard>;
  heading: string;
  id: string;
}) {
  if (records.length === 0) return null;
  const now = currentObservations(records);
  const phrases = observationPhrases(now);
  const last = records[records.length - 1]!;
  return (
    <div className="pl-observed" aria-labelledby={id}>
      <h3 id={id} className="pl-op-group">
        {heading}
      </h3>
      <p>{phrases.length ? `${phrases.join(', ')}.` : 'No clues recorded.'}</p>
      {now.note && <blockquote className="pl-tl-quote">{now.note}</blockquote>}
      <p className="pl-hint">
        As of {dateWords(last.time)}, by {nameOf(cards, last.actor)}.
      </p>
      {records.length > 1 && (
        <details className="pl-fold">
          <summary>
            {records.length - 1} earlier {records.length === 2 ? 'record' : 'records'}, since superseded
          </summary>
          <ul>
            {records.slice(0, -1).map((r) => (
              <li key={r.seq}>
                {dateWords(r.time)} · entry {r.seq}:{' '}
                {observationPhrases(r.observations).join(', ') || 'a note'}
                {r.observations.note ? ` — “${r.observations.note}”` : ''}
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}

/**
 * What the lots these beads came from carried: their observations and exhibits, each marked
 * with where and when it was recorded (their opinions are listed with this lot's).
 */
export function Inherited({
  code,
  inherited,
  ancestors,
  cards,
}: {
  code: string;
  inherited: readonly InheritedEntry[];
  ancestors: readonly AncestorView[];
  cards: Record<string, DealerCard>;
}) {
  if (inherited.length === 0) return null;
  const lots = [...new Set(inherited.map((i) => i.lot))];
  return (
    <section className="pl-section" aria-labelledby="pl-inh-h">
      <h2 id="pl-inh-h">Carried from the lots these beads came from</h2>
      <p className="pl-hint">
        Recorded on earlier lots and checked in this browser like this lot’s own entries.
      </p>
      {lots.map((lot) => {
        const items = inherited.filter((i) => i.lot === lot);
        const first = items[0]!;
        const a = ancestors.find((x) => x.lot === lot);
        const records: ObservationRecord[] = items
          .filter((i) => i.kind === 'observed')
          .map((i) => ({
            seq: i.seq,
            time: i.time,
            actor: i.actor,
            observations: (i.body as ObservedBody).observations,
          }));
        const exhibits: ShownExhibit[] = items
          .filter((i) => i.kind === 'exhibit-added')
          .map((i) => ({
            seq: i.seq,
            time: i.time,
            actor: i.actor,
            exhibit: (i.body as Extract<ExhibitAddedBody, { exhibit: unknown }>).exhibit,
            from: { lot, listed: i.listed },
          }));
        const opinions = items.filter((i) => i.kind === 'opinion').length;
        const display = formatLotCode(lot);
        return (
          <article key={lot} className="pl-inherited" aria-label={`Carried from lot ${display}`}>
            <h3 className="pl-inherited-h">
              {first.listed ? <a href={`/l/${lot}`}>Lot {display}</a> : <>Lot {display}</>}
              {a?.title ? ` · ${a.title}` : ''}
            </h3>
            <p className="pl-hint">
              {first.depth === 1 ? 'The beads came from this lot' : 'An earlier lot in this one’s line'}; it
              was {first.left.kind === 'split' ? 'split' : 'combined into another lot'} on{' '}
              {dateWords(first.left.time)}
              {first.listed
                ? '.'
                : '. It is not listed: only its opinions and the exhibits they cite are public.'}
            </p>
            <ObservationSummary
              records={records}
              cards={cards}
              heading="What its holder recorded"
              id={`pl-inh-obs-${lot}`}
            />
            {exhibits.length > 0 && (
              <>
                <h3 className="pl-op-group">Its evidence</h3>
                <ExhibitList code={code} exhibits={exhibits} cards={cards} />
                <p className="pl-hint">
                  {exhibits.map((x) => `entry ${x.seq}: ${leftWordsFor(items, x.seq)}`).join('; ')}.
                </p>
              </>
            )}
            {opinions > 0 && (
              <p>
                <a href="#pl-op-h">
                  {opinions} {opinions === 1 ? 'opinion' : 'opinions'} recorded on this lot
                </a>{' '}
                {opinions === 1 ? 'is' : 'are'} weighed with this lot’s own above.
              </p>
            )}
          </article>
        );
      })}
    </section>
  );
}

function leftWordsFor(items: readonly InheritedEntry[], seq: number): string {
  const i = items.find((x) => x.seq === seq)!;
  return `recorded ${leftWords(i.left, i.before)}`;
}
