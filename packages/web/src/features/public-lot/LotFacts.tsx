import type { RollState } from '@beadroll/core';
import type { DealerCard } from './public-lot.api';
import { nameOf } from './timeline';
import {
  BASE_GLASS_WORDS,
  countWords,
  dateWords,
  DECORATION_WORDS,
  diameterWords,
  FORM_WORDS,
  lengthWords,
} from './words';

/** The holder as the registry reports them: a card, not part of the checked history. */
export function HolderCard({ state, cards }: { state: RollState; cards: Record<string, DealerCard> }) {
  const card = cards[state.holder];
  const heading = state.status === 'held' || state.status === 'offered' ? 'Held by' : 'Last held by';
  return (
    <section className="pl-card pl-holder" aria-labelledby="pl-holder-h">
      <h2 id="pl-holder-h">{heading}</h2>
      {card ? (
        <>
          <p className="pl-holder-name">{card.displayName}</p>
          {card.business && card.business !== card.displayName && <p>{card.business}</p>}
          <p>{[card.town, card.country].filter(Boolean).join(', ')}</p>
          <p className={`pl-holder-status pl-holder-${card.status}`}>
            {card.status === 'verified'
              ? `Verified by the registry${card.verifiedSince ? ` since ${dateWords(card.verifiedSince)}` : ''}`
              : card.status === 'suspended'
                ? 'Account suspended by the registry'
                : 'No longer trading through Beadroll'}
          </p>
        </>
      ) : (
        <p>The registry has no dealer card for this account.</p>
      )}
      <p className="pl-registry-note">Reported by the registry; not part of the checked history.</p>
      {state.status === 'offered' && (
        <p>
          An offer to{' '}
          {state.openOffer?.recipient && cards[state.openOffer.recipient]
            ? nameOf(cards, state.openOffer.recipient)
            : 'another dealer'}{' '}
          is open.
        </p>
      )}
      {state.status === 'sold' && (
        <p>Sold to a private buyer{state.soldOn ? ` on ${dateWords(state.soldOn)}` : ''}.</p>
      )}
    </section>
  );
}

/** The newest description, as verified. */
export function LotFacts({ state }: { state: RollState }) {
  const d = state.description;
  if (!d) {
    return (
      <section className="pl-section" aria-labelledby="pl-facts-h">
        <h2 id="pl-facts-h">Description</h2>
        <p>The current description was removed by the registrar.</p>
      </section>
    );
  }
  const linked = state.status === 'split' || state.status === 'combined' || state.children.length > 0;
  const rows: [string, string][] = [
    ['Form', FORM_WORDS[d.form]],
    ['Count', countWords(d.count) + (linked ? `; ${countWords(state.remaining)} remain in this lot` : '')],
  ];
  if (d.diameterMm) rows.push(['Bead size', diameterWords(d.diameterMm)]);
  if (d.strandLengthMm !== undefined) rows.push(['Strand length', lengthWords(d.strandLengthMm)]);
  if (d.colours.length) rows.push(['Colours', d.colours.join(', ')]);
  if (d.baseGlass.length) rows.push(['Base glass', d.baseGlass.map((g) => BASE_GLASS_WORDS[g]).join(', ')]);
  if (d.decoration.length || d.decorationNote)
    rows.push([
      'Decoration',
      [d.decoration.map((x) => DECORATION_WORDS[x]).join(', '), d.decorationNote].filter(Boolean).join('. '),
    ]);
  if (d.condition) rows.push(['Condition', d.condition]);
  return (
    <section className="pl-section" aria-labelledby="pl-facts-h">
      <h2 id="pl-facts-h">Description</h2>
      {d.summary && <p className="pl-summary">{d.summary}</p>}
      <dl className="pl-facts">
        {rows.map(([k, v]) => (
          <div key={k}>
            <dt>{k}</dt>
            <dd>{v}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
