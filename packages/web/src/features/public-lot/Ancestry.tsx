import { formatLotCode, type RollState } from '@beadroll/core';
import type { AncestorView } from './check-lot';
import { countWords } from './words';

/** Lots this one was made from (as far back as the bundle goes) and the lots made from it. */
export function Ancestry({ state, ancestors }: { state: RollState; ancestors: AncestorView[] }) {
  if (ancestors.length === 0 && state.children.length === 0) return null;
  const depths = [...new Set(ancestors.map((a) => a.depth))].sort((a, b) => b - a);
  return (
    <section className="pl-section" aria-labelledby="pl-anc-h">
      <h2 id="pl-anc-h">Where the beads came from and went</h2>
      <ol className="pl-tree">
        {depths.map((depth) => (
          <li key={depth} className="pl-tree-level">
            <p className="pl-tree-label">{depth === 1 ? 'Made from' : `Further back (${depth} steps)`}</p>
            <ul>
              {ancestors
                .filter((a) => a.depth === depth)
                .map((a) => (
                  <li key={a.lot} className="pl-node">
                    <LotName lot={a.lot} listed={a.listed} />
                    <span className="pl-node-title">{a.title ?? (a.listed ? '' : 'an unlisted lot')}</span>
                    <span className="pl-node-how">
                      {a.via
                        .map((v) => `${v.kind === 'split' ? 'split' : 'combined'} at its entry ${v.seq}`)
                        .join('; ')}
                    </span>
                  </li>
                ))}
            </ul>
          </li>
        ))}
        <li className="pl-tree-level">
          <p className="pl-tree-label">This lot</p>
          <ul>
            <li className="pl-node pl-node-self">
              <span className="pl-node-code">{formatLotCode(state.lot)}</span>
              <span className="pl-node-title">{state.description?.title ?? ''}</span>
            </li>
          </ul>
        </li>
        {state.children.length > 0 && (
          <li className="pl-tree-level">
            <p className="pl-tree-label">Made into</p>
            <ul>
              {state.children.map((c) => (
                <li key={`${c.lot}-${c.seq}`} className="pl-node">
                  <LotName lot={c.lot} listed />
                  <span className="pl-node-how">
                    {countWords(c.count)}, entry {c.seq}
                  </span>
                </li>
              ))}
            </ul>
          </li>
        )}
      </ol>
      <p className="pl-hint">
        A lot made from another names its entry by fingerprint, and that entry names it back; both sides were
        checked here. A lot that is not listed shows only those linking entries.
      </p>
    </section>
  );
}

function LotName({ lot, listed }: { lot: string; listed: boolean }) {
  return listed ? (
    <a className="pl-node-code" href={`/l/${lot}`}>
      {formatLotCode(lot)}
    </a>
  ) : (
    <span className="pl-node-code">{formatLotCode(lot)}</span>
  );
}
