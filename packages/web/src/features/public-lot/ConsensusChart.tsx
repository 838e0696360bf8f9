import type { OpinionBody, Origin } from '@beadroll/core';
import { useId, type ReactNode } from 'react';
import { ORIGIN_WORDS, periodWords, yearWords } from './words';

export type OpinionRole = 'attribution' | 'dissent' | 'other';

export interface ChartOpinion {
  seq: number;
  author: string;
  body: OpinionBody;
  role: OpinionRole;
}

/** A year step that gives at most `max` ticks over the span. */
export function tickStep(span: number, max = 6): number {
  for (const s of [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000])
    if (span / s <= max) return s;
  return 10000;
}

/** The axis of the chart: whole ticks around every period, with a little room either side. */
export function yearAxis(opinions: { body: OpinionBody }[]): { from: number; to: number; ticks: number[] } {
  const lo = Math.min(...opinions.map((o) => o.body.period.from));
  const hi = Math.max(...opinions.map((o) => o.body.period.to));
  const step = tickStep(Math.max(hi - lo, 10));
  const from = Math.floor(lo / step) * step;
  const to = Math.max(Math.ceil(hi / step) * step, from + step);
  const ticks: number[] = [];
  for (let y = from; y <= to; y += step) ticks.push(y);
  return { from, to, ticks };
}

const W = 360;
const LABEL_H = 20;
const BAR_H = 14;
const GAP = 6;
const PAD_X = 12;

/**
 * Opinions grouped by origin, each period a bar on one year axis. The holder's attribution is
 * solid brand colour, dissents are a warm contrasting colour with a stripe, other opinions pale.
 */
export function ConsensusChart({
  opinions,
  nameOf,
}: {
  opinions: ChartOpinion[];
  nameOf: (actor: string) => string;
}) {
  const id = `pl-chart-${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  if (opinions.length === 0) return null;
  const axis = yearAxis(opinions);
  const groups = new Map<Origin, ChartOpinion[]>();
  for (const o of opinions) groups.set(o.body.origin, [...(groups.get(o.body.origin) ?? []), o]);
  const x = (y: number) => PAD_X + ((y - axis.from) / (axis.to - axis.from)) * (W - 2 * PAD_X);
  let yPos = 4;
  const rows: ReactNode[] = [];
  for (const [origin, list] of groups) {
    rows.push(
      <text key={`g-${origin}`} x={PAD_X} y={yPos + 14} className="pl-chart-group">
        {ORIGIN_WORDS[origin]} ({list.length})
      </text>,
    );
    yPos += LABEL_H;
    for (const o of list) {
      const x0 = x(o.body.period.from);
      const w = Math.max(x(o.body.period.to) - x0, 4);
      rows.push(
        <g
          key={o.seq}
          className={`pl-bar pl-bar-${o.role}${o.body.period.approximate ? ' pl-bar-approx' : ''}`}
        >
          <title>{`${roleWords(o.role)} by ${nameOf(o.author)}: ${ORIGIN_WORDS[o.body.origin]}, ${periodWords(o.body.period)}`}</title>
          <rect x={x0} y={yPos} width={w} height={BAR_H} rx={3} />
          {o.role === 'dissent' && (
            <rect x={x0} y={yPos} width={w} height={BAR_H} rx={3} style={{ fill: `url(#${id}-stripe)` }} />
          )}
        </g>,
      );
      yPos += BAR_H + GAP;
    }
    yPos += GAP;
  }
  const axisY = yPos + 2;
  const H = axisY + 22;
  const summary = [...groups].map(([o, l]) => `${l.length} for ${ORIGIN_WORDS[o]}`).join(', ');
  return (
    <figure className="pl-chart">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        role="img"
        aria-labelledby={`${id}-t`}
        aria-describedby={`${id}-d`}
        className="pl-chart-svg"
      >
        <title id={`${id}-t`}>Opinions by origin and period</title>
        <desc id={`${id}-d`}>
          {`${opinions.length} ${opinions.length === 1 ? 'opinion' : 'opinions'}: ${summary}; years ${yearWords(axis.from)} to ${yearWords(axis.to)}.`}
        </desc>
        <defs>
          <pattern
            id={`${id}-stripe`}
            width="6"
            height="6"
            patternUnits="userSpaceOnUse"
            patternTransform="rotate(45)"
          >
            <rect width="2" height="6" className="pl-stripe" />
          </pattern>
        </defs>
        {axis.ticks.map((t) => (
          <g key={t} className="pl-chart-tick">
            <line x1={x(t)} x2={x(t)} y1={0} y2={axisY} />
            <text x={x(t)} y={axisY + 16} textAnchor="middle">
              {yearWords(t)}
            </text>
          </g>
        ))}
        {rows}
      </svg>
      <figcaption className="pl-chart-legend">
        <span>
          <i className="pl-key pl-key-attribution" aria-hidden="true" /> attribution on record
        </span>
        <span>
          <i className="pl-key pl-key-dissent" aria-hidden="true" /> dissent
        </span>
        <span>
          <i className="pl-key pl-key-other" aria-hidden="true" /> agrees or other
        </span>
        <span>dashed edge: approximate years</span>
      </figcaption>
    </figure>
  );
}

export function roleWords(role: OpinionRole): string {
  return role === 'attribution' ? 'Attribution on record' : role === 'dissent' ? 'Dissent' : 'Opinion';
}
