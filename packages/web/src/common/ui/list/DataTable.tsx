import {
  makeStyles,
  Table,
  TableBody,
  TableCell,
  TableHeader,
  TableHeaderCell,
  TableRow,
} from '@fluentui/react-components';
import {
  createColumnHelper,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type RowData,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, type ReactNode } from 'react';
import type { ListSort } from './list-params';

/** One column of a list: its heading, how a row shows in it, and the server's sort name if it sorts. */
export interface ListColumn<T> {
  id: string;
  header: ReactNode;
  cell: (row: T) => ReactNode;
  /** The server's sort name; a column without one does not sort. */
  sort?: string;
  /** Sorts newest or largest first on the first click. */
  descFirst?: boolean;
  /** Right-aligned figures. */
  numeric?: boolean;
}

const useStyles = makeStyles({
  scroller: { overflowX: 'auto' },
  wide: { minWidth: '760px' },
  number: { textAlign: 'end', fontVariantNumeric: 'tabular-nums' },
});

const features = tableFeatures({ rowSortingFeature });

/**
 * A table of rows the server already sorted and paged: a heading that sorts is a button showing
 * its direction, and a click asks for the new order through `onSort` (kept in the address).
 */
export function DataTable<T extends RowData>({
  label,
  columns,
  rows,
  rowKey,
  sort,
  onSort,
  wide = false,
  size,
}: {
  label: string;
  columns: ReadonlyArray<ListColumn<T>>;
  rows: readonly T[];
  rowKey: (row: T) => string;
  sort?: ListSort;
  onSort?: (sort: ListSort) => void;
  /** Many columns: on a narrow screen the table scrolls sideways instead of squeezing them. */
  wide?: boolean;
  size?: 'small' | 'medium';
}) {
  const styles = useStyles();
  const defs = useMemo(() => {
    const helper = createColumnHelper<typeof features, T>();
    return helper.columns(
      columns.map((c) =>
        helper.accessor(() => null, {
          id: c.id,
          header: () => c.header,
          cell: (ctx) => c.cell(ctx.row.original),
          enableSorting: Boolean(c.sort && onSort),
          sortDescFirst: Boolean(c.descFirst),
        }),
      ),
    );
  }, [columns, onSort]);
  const sortColumn = sort ? columns.find((c) => c.sort === sort.key) : undefined;
  const sorting: SortingState = sortColumn && sort ? [{ id: sortColumn.id, desc: sort.desc }] : [];
  const table = useTable({
    features,
    columns: defs,
    data: rows as T[],
    getRowId: rowKey,
    manualSorting: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    state: { sorting },
    onSortingChange: (updater) => {
      const next = (typeof updater === 'function' ? updater(sorting) : updater)[0];
      const key = next && columns.find((c) => c.id === next.id)?.sort;
      if (key && onSort) onSort({ key, desc: next.desc });
    },
  });
  const numeric = new Set(columns.filter((c) => c.numeric).map((c) => c.id));

  return (
    <div className={styles.scroller}>
      <Table aria-label={label} size={size} className={wide ? styles.wide : undefined}>
        <TableHeader>
          {table.getHeaderGroups().map((group) => (
            <TableRow key={group.id}>
              {group.headers.map((header) => {
                const sortable = header.column.getCanSort();
                const dir = header.column.getIsSorted();
                return (
                  <TableHeaderCell
                    key={header.id}
                    className={numeric.has(header.column.id) ? styles.number : undefined}
                    sortable={sortable}
                    sortDirection={dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : undefined}
                    onClick={sortable ? header.column.getToggleSortingHandler() : undefined}
                  >
                    <table.FlexRender header={header} />
                  </TableHeaderCell>
                );
              })}
            </TableRow>
          ))}
        </TableHeader>
        <TableBody>
          {table.getRowModel().rows.map((row) => (
            <TableRow key={row.id}>
              {row.getAllCells().map((cell) => (
                <TableCell key={cell.id} className={numeric.has(cell.column.id) ? styles.number : undefined}>
                  <table.FlexRender cell={cell} />
                </TableCell>
              ))}
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </div>
  );
}
