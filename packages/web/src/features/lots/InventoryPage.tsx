import {
  LOT_FORMS,
  ORIGINS,
  periodWords,
  TECHNIQUES,
  type LotForm,
  type LotStatus,
  type Origin,
  type Technique,
} from '@beadroll/core';
import {
  Badge,
  Button,
  Card,
  Dropdown,
  Field,
  makeStyles,
  Option,
  SearchBox,
  Spinner,
  Table,
  TableBody,
  TableCell,
  TableHeader,
  TableHeaderCell,
  TableRow,
  Text,
  Title2,
  tokens,
} from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import {
  createColumnHelper,
  rowPaginationFeature,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type SortingState,
} from '@tanstack/react-table';
import { useEffect, useState } from 'react';
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { useSession } from '../accounts/accounts.api';
import { TECHNIQUE_LABELS } from '../opinions/words';
import { formatCount, formatTime, FORM_LABEL, ORIGIN_LABEL, STATUS_LABEL } from './labels';
import {
  LIST_SORTS,
  lotsExportUrl,
  lotsQueries,
  type ListSort,
  type LotListParams,
  type LotSummary,
} from './lots.api';

const PAGE_SIZE = 20;
const STATUSES: LotStatus[] = ['held', 'offered', 'sold', 'split', 'combined', 'retired'];
/** Column id → the server's sort name. */
const SORT_OF: Record<string, ListSort> = {
  code: 'code',
  title: 'title',
  form: 'form',
  count: 'count',
  origin: 'origin',
  period: 'period',
  status: 'status',
  listed: 'listed',
  updatedAt: 'updated',
};

/** How the inventory marks an attribution on record that is not the holder's own. */
const SOURCE_NOTE: Record<NonNullable<LotSummary['originSource']>, string> = {
  holder: '',
  'earlier-holder': ' (previous holder’s)',
  ancestor: ' (from the lot it came from)',
};

const useStyles = makeStyles({
  page: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: tokens.spacingVerticalL },
  top: {
    display: 'flex',
    flexWrap: 'wrap',
    gap: tokens.spacingHorizontalM,
    alignItems: 'center',
    justifyContent: 'space-between',
  },
  filters: {
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fit, minmax(10rem, 1fr))',
    gap: tokens.spacingHorizontalM,
    alignItems: 'end',
  },
  // Fluent's dropdown is at least 250 px wide; here each control fills its own cell instead.
  control: { minWidth: 0, width: '100%' },
  code: { fontFamily: tokens.fontFamilyMonospace, whiteSpace: 'nowrap' },
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
  card: { display: 'grid', gap: tokens.spacingVerticalXXS, padding: tokens.spacingHorizontalM },
  sub: { color: tokens.colorNeutralForeground3 },
  pager: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  stale: { opacity: 0.6 },
  empty: { padding: tokens.spacingHorizontalL, display: 'grid', gap: tokens.spacingVerticalS },
});

const features = tableFeatures({ rowSortingFeature, rowPaginationFeature });
const helper = createColumnHelper<typeof features, LotSummary>();
const columns = helper.columns([
  helper.accessor('displayCode', { id: 'code', header: 'Code' }),
  helper.accessor('title', { header: 'Title' }),
  helper.accessor('form', { header: 'Form' }),
  helper.accessor('count', { header: 'Count' }),
  helper.accessor('origin', { header: 'Origin' }),
  helper.accessor('period', { header: 'Period' }),
  helper.accessor('status', { header: 'Status' }),
  helper.accessor('listed', { header: 'Listed' }),
  helper.accessor('updatedAt', { header: 'Last entry' }),
]);

const EMPTY: LotSummary[] = [];

function pick<T extends string>(v: string | null, allowed: readonly T[]): T | undefined {
  return allowed.includes(v as T) ? (v as T) : undefined;
}

/** The list's parameters as the URL holds them. */
export function paramsFromSearch(search: URLSearchParams): LotListParams {
  const listed = search.get('listed');
  return {
    page: Math.max(1, Math.floor(Number(search.get('page'))) || 1),
    pageSize: PAGE_SIZE,
    sort: pick(search.get('sort'), LIST_SORTS) ?? 'updated',
    order: search.get('order') === 'asc' ? 'asc' : 'desc',
    q: search.get('q')?.trim() || undefined,
    status: pick(search.get('status'), STATUSES),
    form: pick(search.get('form'), LOT_FORMS),
    origin: pick(search.get('origin'), ORIGINS),
    technique: pick(search.get('technique'), TECHNIQUES),
    listed: listed === 'true' ? true : listed === 'false' ? false : undefined,
    mine: search.get('scope') === 'all' ? undefined : true,
  };
}

function Cell({ row, column }: { row: LotSummary; column: string }) {
  const styles = useStyles();
  switch (column) {
    case 'code':
      return <span className={styles.code}>{row.displayCode}</span>;
    case 'title':
      return <Link to={`/lots/${row.code}`}>{row.title}</Link>;
    case 'form':
      return <>{row.form ? FORM_LABEL[row.form] : '—'}</>;
    case 'count':
      return <>{formatCount(row.count)}</>;
    case 'origin':
      return (
        <>
          {row.origin
            ? `${ORIGIN_LABEL[row.origin]}${SOURCE_NOTE[row.originSource ?? 'holder']}`
            : 'No attribution yet'}
          {row.technique ? (
            <Text size={200} block className={styles.sub}>
              {TECHNIQUE_LABELS[row.technique]}
            </Text>
          ) : null}
        </>
      );
    case 'period':
      return <>{row.period ? periodWords({ ...row.period, approximate: false }) : '—'}</>;
    case 'status':
      return <>{STATUS_LABEL[row.status]}</>;
    case 'listed':
      return row.listed ? <Badge appearance="tint">Listed</Badge> : <Text>Unlisted</Text>;
    case 'updatedAt':
      return <time dateTime={row.updatedAt}>{formatTime(row.updatedAt)}</time>;
    default:
      return null;
  }
}

/** The dealer's inventory: the server pages, sorts and filters; the URL keeps the view. */
export function InventoryPage() {
  const styles = useStyles();
  const { account, isLoading } = useSession();
  const navigate = useNavigate();
  const [search, setSearch] = useSearchParams();
  const params = paramsFromSearch(search);
  const [text, setText] = useState(params.q ?? '');
  const query = useQuery({ ...lotsQueries.list(params), enabled: account !== null });

  const update = (changes: Record<string, string | undefined>, resetPage = true) => {
    const next = new URLSearchParams(search);
    for (const [k, v] of Object.entries(changes)) {
      if (v === undefined || v === '') next.delete(k);
      else next.set(k, v);
    }
    if (resetPage) next.delete('page');
    setSearch(next, { replace: true });
  };

  // Searching as one types, a moment after the last key.
  useEffect(() => {
    if ((params.q ?? '') === text.trim()) return;
    const t = setTimeout(() => update({ q: text.trim() || undefined }), 300);
    return () => clearTimeout(t);
  });

  const sortColumn = Object.entries(SORT_OF).find(([, s]) => s === params.sort)?.[0];
  const sorting: SortingState = sortColumn ? [{ id: sortColumn, desc: params.order === 'desc' }] : [];
  const total = query.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const table = useTable({
    features,
    columns,
    data: query.data?.items ?? EMPTY,
    manualSorting: true,
    manualPagination: true,
    rowCount: total,
    state: { sorting, pagination: { pageIndex: params.page - 1, pageSize: PAGE_SIZE } },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const s = next[0];
      update(
        s ? { sort: SORT_OF[s.id], order: s.desc ? 'desc' : 'asc' } : { sort: undefined, order: undefined },
      );
    },
    onPaginationChange: (updater) => {
      const next =
        typeof updater === 'function'
          ? updater({ pageIndex: params.page - 1, pageSize: PAGE_SIZE })
          : updater;
      update({ page: String(next.pageIndex + 1) }, false);
    },
  });

  if (isLoading) return <Spinner label="Loading…" />;
  if (!account) return <Navigate to="/sign-in?next=/lots" replace />;

  const filtered = Boolean(
    params.q ||
    params.status ||
    params.form ||
    params.origin ||
    params.technique ||
    params.listed !== undefined,
  );
  const rows = table.getRowModel().rows;
  const stale = query.isPlaceholderData;

  const { page: _p, pageSize: _s, ...filters } = params;

  return (
    <section className={styles.page} aria-labelledby="inventory-title">
      <div className={styles.top}>
        <Title2 as="h1" id="inventory-title">
          Inventory
        </Title2>
        <div className={styles.pager}>
          <Button as="a" href={lotsExportUrl(filters, 'csv')} download disabled={total === 0}>
            Export CSV
          </Button>
          <Button as="a" href={lotsExportUrl(filters, 'xlsx')} download disabled={total === 0}>
            Export XLSX
          </Button>
          {account.role === 'dealer' && account.status === 'verified' ? (
            <Button appearance="primary" onClick={() => navigate('/lots/new')}>
              Register a lot
            </Button>
          ) : null}
        </div>
      </div>
      <div className={styles.filters} role="search" aria-label="Find lots">
        <Field label="Search">
          <SearchBox
            className={styles.control}
            value={text}
            placeholder="Code, title, attribution, colour, storage place"
            onChange={(_, d) => setText(d.value)}
          />
        </Field>
        <Field label="Whose">
          <Dropdown
            className={styles.control}
            value={params.mine ? 'Lots I hold' : 'All I can see'}
            selectedOptions={[params.mine ? 'mine' : 'all']}
            onOptionSelect={(_, d) => update({ scope: d.optionValue === 'all' ? 'all' : undefined })}
          >
            <Option value="mine">Lots I hold</Option>
            <Option value="all">All I can see</Option>
          </Dropdown>
        </Field>
        <FilterDropdown
          label="Status"
          value={params.status}
          options={STATUSES.map((s) => [s, STATUS_LABEL[s]])}
          onChange={(v) => update({ status: v })}
        />
        <FilterDropdown
          label="Form"
          value={params.form}
          options={LOT_FORMS.map((f) => [f, FORM_LABEL[f as LotForm]])}
          onChange={(v) => update({ form: v })}
        />
        <FilterDropdown
          label="Origin"
          value={params.origin}
          options={ORIGINS.map((o) => [o, ORIGIN_LABEL[o as Origin]])}
          onChange={(v) => update({ origin: v })}
        />
        <FilterDropdown
          label="Technique"
          value={params.technique}
          options={TECHNIQUES.map((t) => [t, TECHNIQUE_LABELS[t as Technique]])}
          onChange={(v) => update({ technique: v })}
        />
        <FilterDropdown
          label="Listed"
          value={params.listed === undefined ? undefined : String(params.listed)}
          options={[
            ['true', 'Listed'],
            ['false', 'Unlisted'],
          ]}
          onChange={(v) => update({ listed: v })}
        />
      </div>

      {query.isPending ? (
        <Spinner label="Loading your lots…" />
      ) : query.isError ? (
        <Card className={styles.empty}>
          <Text>The lots could not be loaded. Please try again.</Text>
          <Button onClick={() => query.refetch()}>Try again</Button>
        </Card>
      ) : total === 0 ? (
        <Card className={styles.empty}>
          {filtered ? (
            <>
              <Text>No lot matches these filters.</Text>
              <Button
                onClick={() => {
                  setText('');
                  setSearch(new URLSearchParams(params.mine ? {} : { scope: 'all' }), { replace: true });
                }}
              >
                Clear the filters
              </Button>
            </>
          ) : (
            <>
              <Text>No lots yet.</Text>
              {account.role === 'dealer' ? <Link to="/lots/new">Register your first lot</Link> : null}
            </>
          )}
        </Card>
      ) : (
        <div className={stale ? styles.stale : undefined} aria-busy={stale}>
          <div className={styles.wide}>
            <Table aria-label="Lots" size="small">
              <TableHeader>
                {table.getHeaderGroups().map((group) => (
                  <TableRow key={group.id}>
                    {group.headers.map((header) => {
                      const sortable = header.column.getCanSort();
                      const dir = header.column.getIsSorted();
                      return (
                        <TableHeaderCell
                          key={header.id}
                          sortable={sortable}
                          sortDirection={
                            dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : undefined
                          }
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
                {rows.map((row) => (
                  <TableRow key={row.id}>
                    {row.getAllCells().map((cell) => (
                      <TableCell key={cell.id}>
                        <Cell row={row.original} column={cell.column.id} />
                      </TableCell>
                    ))}
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </div>
          <ul className={styles.cards} aria-label="Lots">
            {rows.map((row) => {
              const r = row.original;
              return (
                <li key={row.id}>
                  <Card className={styles.card}>
                    <Link to={`/lots/${r.code}`}>
                      <Text weight="semibold">{r.title}</Text>
                    </Link>
                    <Text size={200} className={styles.code}>
                      {r.displayCode}
                    </Text>
                    <Text size={200}>
                      {r.form ? FORM_LABEL[r.form] : '—'} · {formatCount(r.count)} beads ·{' '}
                      {r.origin
                        ? `${ORIGIN_LABEL[r.origin]}${SOURCE_NOTE[r.originSource ?? 'holder']}`
                        : 'no attribution yet'}
                      {r.period ? `, ${periodWords({ ...r.period, approximate: false })}` : ''}
                    </Text>
                    <Text size={200} className={styles.sub}>
                      {STATUS_LABEL[r.status]} · {r.listed ? 'listed' : 'unlisted'} · last entry{' '}
                      {formatTime(r.updatedAt)}
                    </Text>
                  </Card>
                </li>
              );
            })}
          </ul>
        </div>
      )}
      {total > 0 ? (
        <nav className={styles.pager} aria-label="Pages">
          <Button disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>
            Previous
          </Button>
          <Text>
            Page {params.page} of {pages} · {total} {total === 1 ? 'lot' : 'lots'}
            {stale ? ' · loading…' : ''}
          </Text>
          <Button disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>
            Next
          </Button>
        </nav>
      ) : null}
    </section>
  );
}

function FilterDropdown({
  label,
  value,
  options,
  onChange,
}: {
  label: string;
  value: string | undefined;
  options: Array<[string, string]>;
  onChange: (v: string | undefined) => void;
}) {
  const styles = useStyles();
  const current = options.find(([v]) => v === value);
  return (
    <Field label={label}>
      <Dropdown
        className={styles.control}
        value={current ? current[1] : 'Any'}
        selectedOptions={[value ?? '']}
        onOptionSelect={(_, d) => onChange(d.optionValue || undefined)}
      >
        <Option value="">Any</Option>
        {options.map(([v, l]) => (
          <Option key={v} value={v}>
            {l}
          </Option>
        ))}
      </Dropdown>
    </Field>
  );
}
