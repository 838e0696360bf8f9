import { formatLotCode } from '@beadroll/core';
import type { DiagramEdge, DiagramGraph, DiagramNode } from './graph';
import './ancestry-diagram.css';

const BOX_W = 168;
const BOX_H = 46;
const GAP_X = 20;
const GAP_Y = 46;
const PAD = 8;

interface Placed extends DiagramNode {
  x: number;
  y: number;
}

function shorten(text: string, max = 24): string {
  return text.length > max ? `${text.slice(0, max - 1)}…` : text;
}

function countLabel(e: DiagramEdge): string {
  return `${e.count.estimated ? '~' : ''}${e.count.value}`;
}

/** Rows by generation (oldest on top); inside a row, lots sit under the lots they came from. */
function layout(graph: DiagramGraph): { placed: Map<string, Placed>; width: number; height: number } {
  const depths = [...new Set(graph.nodes.map((n) => n.depth))].sort((a, b) => a - b);
  const rows = depths.map((d) => graph.nodes.filter((n) => n.depth === d));
  const widest = Math.max(1, ...rows.map((r) => r.length));
  const width = PAD * 2 + widest * BOX_W + (widest - 1) * GAP_X;
  const placed = new Map<string, Placed>();
  rows.forEach((row, r) => {
    const prevX = (n: DiagramNode) => {
      const xs = graph.edges
        .filter((e) => e.to === n.code && placed.has(e.from))
        .map((e) => placed.get(e.from)!.x);
      return xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : 0;
    };
    const ordered = [...row].sort((a, b) => prevX(a) - prevX(b) || (a.code < b.code ? -1 : 1));
    const rowWidth = ordered.length * BOX_W + (ordered.length - 1) * GAP_X;
    const start = (width - rowWidth) / 2;
    ordered.forEach((n, i) => {
      placed.set(n.code, { ...n, x: start + i * (BOX_W + GAP_X), y: PAD + r * (BOX_H + GAP_Y) });
    });
  });
  return { placed, width, height: PAD * 2 + rows.length * BOX_H + (rows.length - 1) * GAP_Y };
}

function NodeBox({ n, focus }: { n: Placed; focus: boolean }) {
  const code = formatLotCode(n.code);
  const title = n.title ?? (n.href ? '' : 'details not shown');
  const label = `${focus ? 'This lot, ' : 'Lot '}${code}${n.title ? `: ${n.title}` : ''}`;
  const className = `br-anc-node${focus ? ' br-anc-focus' : ''}${n.title === null ? ' br-anc-private' : ''}`;
  const inner = (
    <>
      <title>{label}</title>
      <rect className="br-anc-box" x={n.x} y={n.y} width={BOX_W} height={BOX_H} rx={6} />
      <text className="br-anc-code" x={n.x + 10} y={n.y + 19}>
        {code}
      </text>
      <text className="br-anc-title" x={n.x + 10} y={n.y + 36}>
        {shorten(focus ? `this lot${n.title ? ` · ${n.title}` : ''}` : title)}
      </text>
    </>
  );
  if (!n.href || focus)
    return (
      <g className={className} role="img" aria-label={label}>
        {inner}
      </g>
    );
  return (
    <a className={className} href={n.href} aria-label={label}>
      {inner}
    </a>
  );
}

/**
 * A small diagram of where a lot's beads came from and went: one box per lot (linking to its
 * page when it has one), arrows from parent to child with the bead count; splits drawn solid,
 * combinations dashed. Styled with the theme's CSS variables only, so it also works on pages
 * without the component library.
 */
export function AncestryDiagram({ graph, label }: { graph: DiagramGraph; label?: string }) {
  const { placed, width, height } = layout(graph);
  return (
    <figure className="br-anc" style={{ margin: 0 }}>
      <svg
        width={width}
        height={height}
        viewBox={`0 0 ${width} ${height}`}
        role="group"
        aria-label={label ?? `Where the beads of lot ${formatLotCode(graph.focus)} came from and went`}
      >
        {graph.edges.map((e) => {
          const a = placed.get(e.from);
          const b = placed.get(e.to);
          if (!a || !b) return null;
          const x1 = a.x + BOX_W / 2;
          const y1 = a.y + BOX_H;
          const x2 = b.x + BOX_W / 2;
          const y2 = b.y;
          const my = (y1 + y2) / 2;
          return (
            <g key={`${e.from}-${e.to}-${e.kind}`}>
              <path
                className={`br-anc-edge br-anc-edge-${e.kind}`}
                d={`M${x1},${y1} C${x1},${my} ${x2},${my} ${x2},${y2 - 6}`}
              />
              <path
                className="br-anc-edge"
                d={`M${x2 - 4},${y2 - 8} L${x2},${y2 - 1} L${x2 + 4},${y2 - 8}`}
              />
              <text className="br-anc-count" x={(x1 + x2) / 2 + 6} y={my + 4}>
                {countLabel(e)}
              </text>
            </g>
          );
        })}
        {[...placed.values()].map((n) => (
          <NodeBox key={n.code} n={n} focus={n.code === graph.focus} />
        ))}
      </svg>
      <figcaption className="br-anc-legend">
        Older lots above. Solid line: split; dashed line: combined; numbers are beads (~ estimated).
      </figcaption>
    </figure>
  );
}
