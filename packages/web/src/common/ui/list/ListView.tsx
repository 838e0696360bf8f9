import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import type { RowData } from '@tanstack/react-table';
import type { ReactNode } from 'react';
import { FilterButtons } from '../FilterButtons';
import { DataTable, type ListColumn } from './DataTable';
import { filterValue, type FilterOption, type ListParams } from './list-params';

/** The frame most list pages share: a heading row, filters, the table and the pager. */
export const useListStyles = makeStyles({
  page: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: tokens.spacingVerticalL },
  head: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  grow: { flexGrow: 1 },
  tabs: { overflowX: 'auto', maxWidth: '100%' },
  sub: { color: tokens.colorNeutralForeground3 },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
});

const useStyles = makeStyles({
  pager: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  stale: { opacity: 0.6 },
  wide: { '@media (max-width: 700px)': { display: 'none' } },
  cards: {
    display: 'none',
    '@media (max-width: 700px)': {
      display: 'grid',
      gap: tokens.spacingVerticalS,
      listStyleType: 'none',
      margin: 0,
      padding: 0,
    },
  },
});

/** A count with its noun: "1 lot", "3 lots". */
export function countWords(n: number, noun: readonly [string, string]): string {
  return `${n} ${n === 1 ? noun[0] : noun[1]}`;
}

/**
 * The buttons of one of the list's filters, kept in the address under `name` (see
 * {@link filterValue}); choosing one goes back to the first page.
 */
export function ListFilter<T extends string>({
  list,
  name,
  label,
  options,
}: {
  list: ListParams;
  name: string;
  label: string;
  options: ReadonlyArray<FilterOption<T>>;
}) {
  const styles = useListStyles();
  return (
    <div className={styles.tabs}>
      <FilterButtons
        label={label}
        value={filterValue(list, name, options)}
        options={options}
        onChange={(v) => list.update({ [name]: v === options[0]!.value ? undefined : v })}
      />
    </div>
  );
}

/** Previous and Next around "Page 2 of 5 · 84 lots". */
export function Pager({
  page,
  total,
  pageSize,
  noun,
  loading = false,
  onPage,
}: {
  page: number;
  total: number;
  pageSize: number;
  noun: readonly [string, string];
  loading?: boolean;
  onPage: (p: number) => void;
}) {
  const styles = useStyles();
  const pages = Math.max(1, Math.ceil(total / pageSize));
  return (
    <nav className={styles.pager} aria-label="Pages">
      <Button disabled={page <= 1} onClick={() => onPage(page - 1)}>
        Previous
      </Button>
      <Text>
        Page {page} of {pages} · {countWords(total, noun)}
        {loading ? ' · loading…' : ''}
      </Text>
      <Button disabled={page >= pages} onClick={() => onPage(page + 1)}>
        Next
      </Button>
    </nav>
  );
}

/**
 * One page of a server-paged list: the table (sorting by its headings), optionally a card per
 * row on a phone, and the pager. The order and page live in the address through `list`;
 * `query` is the page the server sent (no data while the first one loads, placeholder data
 * while the next one does); `empty` shows in place of the table when the list has no rows.
 */
export function ListView<T extends RowData>({
  label,
  columns,
  query,
  rowKey = (row) => (row as { id: string }).id,
  list,
  noun,
  empty,
  size,
  card,
}: {
  label: string;
  columns: ReadonlyArray<ListColumn<T>>;
  query: { data?: { items: readonly T[]; total: number }; isPlaceholderData?: boolean };
  /** Each row's key; the row's `id` unless told otherwise. */
  rowKey?: (row: T) => string;
  list: ListParams;
  noun: readonly [string, string];
  /** Shown instead of the table when there are no rows; words are shown as text. */
  empty?: ReactNode;
  size?: 'small' | 'medium';
  /** A phone shows each row as this card instead of the table. */
  card?: (row: T) => ReactNode;
}) {
  const styles = useStyles();
  const { data, isPlaceholderData: stale = false } = query;
  const items = data?.items ?? [];
  const total = data?.total ?? 0;
  const table = (
    <DataTable
      label={label}
      columns={columns}
      rows={items}
      rowKey={rowKey}
      sort={list.sort}
      onSort={list.setSort}
      wide
      size={size}
    />
  );
  if (data && total === 0 && empty !== undefined)
    return typeof empty === 'string' ? <Text>{empty}</Text> : <>{empty}</>;
  return (
    <>
      <div className={stale ? styles.stale : undefined} aria-busy={stale}>
        {card ? (
          <>
            <div className={styles.wide}>{table}</div>
            <ul className={styles.cards} aria-label={label}>
              {items.map((row) => (
                <li key={rowKey(row)}>{card(row)}</li>
              ))}
            </ul>
          </>
        ) : (
          table
        )}
      </div>
      {total > 0 ? (
        <Pager
          page={list.page}
          total={total}
          pageSize={list.pageSize}
          noun={noun}
          loading={stale}
          onPage={list.setPage}
        />
      ) : null}
    </>
  );
}
