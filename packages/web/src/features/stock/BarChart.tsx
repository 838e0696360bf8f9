import { makeStyles, tokens } from '@fluentui/react-components';
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

export interface BarSeries {
  label: string;
  values: number[];
  /** A Fluent colour token's CSS variable name, read from the page's theme. */
  colourVar: string;
}

const useStyles = makeStyles({
  chart: { width: '100%', minHeight: '220px', color: tokens.colorNeutralForeground1 },
});

/** The theme's value of a Fluent colour token (canvas drawing needs the colour itself). */
function themeColour(el: HTMLElement, cssVar: string): string {
  return getComputedStyle(el).getPropertyValue(cssVar).trim() || 'currentColor';
}

/**
 * Bars over named categories, drawn by uPlot on a canvas; the same figures are in a table
 * beside it for screen readers and copying. `format` writes an axis value for people. Pass
 * stable arrays (memoised): a new one redraws the chart.
 */
export function BarChart({
  title,
  categories,
  series,
  format,
}: {
  title: string;
  categories: string[];
  series: BarSeries[];
  format: (v: number) => string;
}) {
  const styles = useStyles();
  const box = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const el = box.current;
    if (!el || categories.length === 0) return;
    const n = categories.length;
    const bars = uPlot.paths.bars!({ size: [0.7, 60], gap: 2 });
    const text = themeColour(el, '--colorNeutralForeground2');
    const grid = themeColour(el, '--colorNeutralStroke2');
    const opts: uPlot.Options = {
      width: Math.max(240, el.clientWidth),
      height: 220,
      legend: { show: false },
      cursor: { show: false },
      scales: {
        x: { time: false, range: [-0.5, n - 0.5] },
        y: { range: (_u, min, max) => [Math.min(0, min), Math.max(1, max) * 1.1] },
      },
      axes: [
        {
          stroke: text,
          grid: { show: false },
          splits: () => categories.map((_, i) => i),
          values: (_u, splits) => splits.map((i) => categories[i] ?? ''),
        },
        { stroke: text, grid: { stroke: grid }, size: 96, values: (_u, splits) => splits.map(format) },
      ],
      series: [
        {},
        // Later series are drawn over earlier ones (a margin over its revenue).
        ...series.map((s) => ({
          label: s.label,
          fill: themeColour(el, s.colourVar),
          stroke: themeColour(el, s.colourVar),
          paths: bars,
          points: { show: false },
        })),
      ],
    };
    const data: uPlot.AlignedData = [categories.map((_, i) => i), ...series.map((s) => s.values)];
    const plot = new uPlot(opts, data, el);
    const resize = new ResizeObserver(() =>
      plot.setSize({ width: Math.max(240, el.clientWidth), height: 220 }),
    );
    resize.observe(el);
    return () => {
      resize.disconnect();
      plot.destroy();
    };
  }, [categories, series, format]);

  return <div ref={box} className={styles.chart} role="img" aria-label={title} />;
}
