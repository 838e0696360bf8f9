import { recordCautions, type VerifiedEntry } from '@beadroll/core';

/**
 * The handling cautions this lot's verified record calls for (a green glow recorded, uranium,
 * lead or crystal named, an origin in China), with their sources. Words and rules come from core.
 */
export function HandlingCautions({ entries }: { entries: VerifiedEntry[] }) {
  const cautions = recordCautions(entries);
  if (cautions.length === 0) return null;
  return (
    <section className="pl-card pl-cautions" aria-labelledby="pl-cautions-h">
      <h2 id="pl-cautions-h">Handling this lot</h2>
      {cautions.map((c) => (
        <div key={c.rule} className="pl-caution-block">
          <p className="pl-caution">{c.text}</p>
          <p className="pl-caution-sources">
            Sources:{' '}
            {c.sources.map((s, i) => (
              <span key={`${s.title}-${i}`}>
                {i > 0 ? '; ' : ''}
                {s.url ? (
                  <a href={s.url} target="_blank" rel="noreferrer">
                    {s.title}
                  </a>
                ) : (
                  s.title
                )}
              </span>
            ))}
          </p>
        </div>
      ))}
    </section>
  );
}
