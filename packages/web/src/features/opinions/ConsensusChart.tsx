import { makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import type { Origin } from '@beadroll/core';
import type { OpinionView } from './opinions.api';
import { originLabel, ORIGIN_LABELS, periodLabel, yearLabel } from './words';

const useStyles = makeStyles({
  figure: { margin: 0, display: 'grid', gap: tokens.spacingVerticalS },
  svg: { width: '100%', maxWidth: '640px', height: 'auto', display: 'block' },
  group: { fill: tokens.colorNeutralForeground1, fontSize: '12px', fontWeight: 700 },
  tick: { stroke: tokens.colorNeutralStroke2 },
  tickText: { fill: tokens.colorNeutralForeground3, fontSize: '11px' },
  attribution: { fill: tokens.colorBrandBackground },
  dissent: { fill: tokens.colorPaletteDarkOrangeBackground3 },
  other: { fill: tokens.colorNeutralBackground5 },
  approx: { strokeDasharray: '3 2', stroke: tokens.colorNeutralForeground2, strokeWidth: 1 },
  legend: {
    display: 'flex',
    flexWrap: 'wrap',
    gap: tokens.spacingHorizontalL,
    fontSize: tokens.fontSizeBase200,
  },
  key: {
    display: 'inline-block',
    width: '14px',
    height: '10px',
    marginInlineEnd: tokens.spacingHorizontalXS,
  },
});

function step(span: number): number {
  for (const s of [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000]) if (span / s <= 6) return s;
  return 2000;
}

const W = 480;
const PAD = 12;
const BAR = 12;
const GAP = 5;
const LABEL = 18;

/**
 * Opinions grouped by origin, each period drawn as a bar on one year axis: the holder's
 * attribution in brand colour, dissents in a warm contrasting colour, other opinions pale.
 */
export function ConsensusChart({
  opinions,
  nameOf,
}: {
  opinions: OpinionView[];
  nameOf: (id: string) => string;
}) {
  const styles = useStyles();
  const shown = opinions.filter((o) => o.body);
  if (shown.length === 0) return null;
  const lo = Math.min(...shown.map((o) => o.body!.period.from));
  const hi = Math.max(...shown.map((o) => o.body!.period.to));
  const s = step(Math.max(hi - lo, 10));
  const from = Math.floor(lo / s) * s;
  const to = Math.max(Math.ceil(hi / s) * s, from + s);
  const ticks: number[] = [];
  for (let y = from; y <= to; y += s) ticks.push(y);
  const x = (y: number) => PAD + ((y - from) / (to - from)) * (W - 2 * PAD);
  const groups = new Map<Origin, OpinionView[]>();
  for (const o of shown) groups.set(o.body!.origin, [...(groups.get(o.body!.origin) ?? []), o]);
  let y = 2;
  const rows: React.ReactNode[] = [];
  for (const [origin, list] of groups) {
    rows.push(
      <text key={`g-${origin}`} x={PAD} y={y + 13} className={styles.group}>
        {ORIGIN_LABELS[origin]} ({list.length})
      </text>,
    );
    y += LABEL;
    for (const o of list) {
      const b = o.body!;
      const x0 = x(b.period.from);
      const w = Math.max(x(b.period.to + 1) - x0, 4);
      rows.push(
        <rect
          key={o.seq}
          x={x0}
          y={y}
          width={Math.min(w, W - PAD - x0)}
          height={BAR}
          rx={3}
          className={mergeClasses(styles[o.role], b.period.approximate && styles.approx)}
        >
          <title>{`${o.role === 'attribution' ? 'Holder’s attribution' : o.role === 'dissent' ? 'Dissent' : 'Opinion'} by ${nameOf(o.author)}: ${originLabel(b.origin, b.originNote)}, ${periodLabel(b.period)}`}</title>
        </rect>,
      );
      y += BAR + GAP;
    }
    y += GAP;
  }
  const axisY = y + 2;
  const H = axisY + 18;
  return (
    <figure className={styles.figure}>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className={styles.svg}
        role="img"
        aria-label={`Consensus chart: ${[...groups].map(([o, l]) => `${l.length} for ${ORIGIN_LABELS[o]}`).join(', ')}; years ${yearLabel(from)} to ${yearLabel(to)}`}
      >
        {ticks.map((t) => (
          <g key={t}>
            <line x1={x(t)} x2={x(t)} y1={0} y2={axisY} className={styles.tick} />
            <text x={x(t)} y={axisY + 14} textAnchor="middle" className={styles.tickText}>
              {yearLabel(t)}
            </text>
          </g>
        ))}
        {rows}
      </svg>
      <figcaption className={styles.legend}>
        <span>
          <svg className={styles.key} aria-hidden="true" viewBox="0 0 14 10">
            <rect width="14" height="10" className={styles.attribution} />
          </svg>
          holder’s attribution
        </span>
        <span>
          <svg className={styles.key} aria-hidden="true" viewBox="0 0 14 10">
            <rect width="14" height="10" className={styles.dissent} />
          </svg>
          dissent
        </span>
        <span>
          <svg className={styles.key} aria-hidden="true" viewBox="0 0 14 10">
            <rect width="14" height="10" className={styles.other} />
          </svg>
          other opinion
        </span>
        <span>dashed edge: approximate years</span>
      </figcaption>
    </figure>
  );
}
