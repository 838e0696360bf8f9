import type { ReactNode } from 'react';
import type { TimelineItem } from './timeline';
import { dateWords } from './words';

/** The roll in plain language, oldest first; the entry the tag names is marked. */
export function Timeline({
  items,
  tagSeq,
  heading = 'History',
}: {
  items: TimelineItem[];
  tagSeq: number | null;
  heading?: string;
}) {
  const bySeq = new Map(items.map((it) => [it.seq, it]));
  const folded = new Set(
    items.flatMap((it) => (it.corrects && bySeq.has(it.corrects.seq) ? [it.corrects.seq] : [])),
  );
  const render = (it: TimelineItem, nested = false): ReactNode => {
    const original = it.corrects ? bySeq.get(it.corrects.seq) : undefined;
    const content = (
      <>
        <p className="pl-tl-when">
          <time dateTime={it.time}>{dateWords(it.time)}</time> · entry {it.seq}
          {tagSeq === it.seq && <span className="pl-tl-tag">your tag was printed here</span>}
        </p>
        <p className="pl-tl-text">{it.text}</p>
        {it.quote && <blockquote className="pl-tl-quote">{it.quote}</blockquote>}
        {it.corrects && (
          <p className="pl-tl-corrects">
            Corrects entry {it.corrects.seq}: {it.corrects.reason}
          </p>
        )}
        {it.links && (
          <ul className="pl-tl-links">
            {it.links.map((l) => (
              <li key={l.lot}>
                <a href={`/l/${l.lot}`} aria-label={`${l.label}: its public history`}>
                  {l.label}
                </a>
              </li>
            ))}
          </ul>
        )}
        {it.removed && (
          <p className="pl-tl-removed-note">
            Removed by the registrar on {it.removed.on}, reason: {it.removed.reason}.
          </p>
        )}
        {it.sealed && (
          <p className="pl-tl-sealed">Private details were sealed with this entry; they are not public.</p>
        )}
        {original && (
          <details className="pl-tl-fold">
            <summary>
              Entry {original.seq} as first written, corrected on {dateWords(it.time)}
            </summary>
            {render(original, true)}
          </details>
        )}
      </>
    );
    const cls = `pl-tl-item pl-tl-${it.kind}${it.removed ? ' pl-tl-removed' : ''}`;
    return nested ? (
      <div className={cls}>{content}</div>
    ) : (
      <li key={it.seq} className={cls}>
        {content}
      </li>
    );
  };
  return (
    <section className="pl-section" aria-labelledby="pl-tl-h">
      <h2 id="pl-tl-h">{heading}</h2>
      <ol className="pl-timeline">{items.filter((it) => !folded.has(it.seq)).map((it) => render(it))}</ol>
    </section>
  );
}
