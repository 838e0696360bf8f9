import { makeStyles, mergeClasses, shorthands, Text, tokens } from '@fluentui/react-components';
import type { SheetRequest } from './tags.api';

const useStyles = makeStyles({
  sheet: {
    display: 'grid',
    gap: '2px',
    padding: tokens.spacingHorizontalS,
    backgroundColor: tokens.colorNeutralBackground3,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke1}`,
    borderRadius: tokens.borderRadiusMedium,
    maxWidth: '16rem',
  },
  cell: {
    minHeight: '18px',
    padding: 0,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke1}`,
    borderRadius: tokens.borderRadiusSmall,
    backgroundColor: tokens.colorNeutralBackground1,
    cursor: 'pointer',
    ':focus-visible': { outline: `${tokens.strokeWidthThick} solid ${tokens.colorStrokeFocus2}` },
  },
  used: { backgroundColor: tokens.colorNeutralBackground5, ...shorthands.borderStyle('dashed') },
  first: {
    backgroundColor: tokens.colorBrandBackground,
    ...shorthands.borderColor(tokens.colorBrandStroke1),
  },
  next: { backgroundColor: tokens.colorBrandBackground2 },
});

/**
 * A picture of one label sheet: labels before the chosen one are marked used, the chosen one
 * is where printing starts, and the ones the print fills after it are shaded. Clicking a label
 * makes it the first free one.
 */
export function SheetPicker({
  columns,
  rows,
  first,
  count,
  onChange,
}: {
  columns: number;
  rows: number;
  /** Index of the first free label (0 = top left), reading left to right, top to bottom. */
  first: number;
  /** Tags to print, to shade the labels they fill. */
  count: number;
  onChange: (first: number) => void;
}) {
  const styles = useStyles();
  const cells = Array.from({ length: columns * rows }, (_, i) => i);
  return (
    <div>
      <div
        className={styles.sheet}
        style={{ gridTemplateColumns: `repeat(${columns}, 1fr)` }}
        role="group"
        aria-label="Labels on the sheet: choose the first free one"
      >
        {cells.map((i) => (
          <button
            key={i}
            type="button"
            className={mergeClasses(
              styles.cell,
              i < first && styles.used,
              i === first && styles.first,
              i > first && i < first + count && styles.next,
            )}
            aria-pressed={i === first}
            aria-label={`Label ${i + 1}, row ${Math.floor(i / columns) + 1}, column ${(i % columns) + 1}${i < first ? ', used' : ''}`}
            onClick={() => onChange(i)}
          />
        ))}
      </div>
      <Text size={200}>
        {first === 0
          ? 'A fresh sheet: printing starts at the top left label.'
          : `${first} ${first === 1 ? 'label is' : 'labels are'} used; printing starts at label ${first + 1}.`}
      </Text>
    </div>
  );
}

/** Columns and rows that fit, as the server lays them out when none are given. */
export function sheetGrid(
  paper: { widthMm: number; heightMm: number },
  label: { widthMm: number; heightMm: number },
  s: SheetRequest,
): { columns: number; rows: number } | null {
  const most = (inner: number, size: number, gap: number) => Math.floor((inner + gap + 1e-6) / (size + gap));
  const columns =
    s.columns ?? most(paper.widthMm - s.marginLeftMm - s.marginRightMm, label.widthMm, s.gapXMm);
  const rows = s.rows ?? most(paper.heightMm - s.marginTopMm - s.marginBottomMm, label.heightMm, s.gapYMm);
  return Number.isInteger(columns) &&
    Number.isInteger(rows) &&
    columns >= 1 &&
    rows >= 1 &&
    columns * rows <= 400
    ? { columns, rows }
    : null;
}
