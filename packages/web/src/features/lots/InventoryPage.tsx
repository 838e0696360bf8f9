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
  Text,
  tokens,
} from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Link, Navigate, useNavigate } from 'react-router-dom';
import type { ListColumn } from '../../common/ui/list/DataTable';
import {
  oneOf,
  useListParams,
  type ListParams,
  type ListSort as UrlSort,
} from '../../common/ui/list/list-params';
import { ListView } from '../../common/ui/list/ListView';
import { useSession } from '../accounts/accounts.api';
import { TECHNIQUE_LABELS } from '../opinions/words';
import { formatCount, formatTime, FORM_LABEL, ORIGIN_LABEL, STATUS_LABEL } from './labels';
import { lotsExportUrl, lotsQueries, type ListSort, type LotListParams, type LotSummary } from './lots.api';
import { Page } from '../../common/ui/Page';

const STATUSES: LotStatus[] = ['held', 'offered', 'sold', 'split', 'combined', 'retired'];
const DEFAULT_SORT: UrlSort = { key: 'updated', desc: true };

/** How the inventory marks an attribution on record that is not the holder's own. */
const SOURCE_NOTE: Record<NonNullable<LotSummary['originSource']>, string> = {
  holder: '',
  'earlier-holder': ' (previous holder’s)',
  ancestor: ' (from the lot it came from)',
};

const useStyles = makeStyles({
  filters: {
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fit, minmax(10rem, 1fr))',
    gap: tokens.spacingHorizontalM,
    alignItems: 'end',
  },
  // Fluent's dropdown is at least 250 px wide; here each control fills its own cell instead.
  control: { minWidth: 0, width: '100%' },
  code: { fontFamily: tokens.fontFamilyMonospace, whiteSpace: 'nowrap' },
  card: { display: 'grid', gap: tokens.spacingVerticalXXS, padding: tokens.spacingHorizontalM },
  sub: { color: tokens.colorNeutralForeground3 },
  buttons: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  empty: { padding: tokens.spacingHorizontalL, display: 'grid', gap: tokens.spacingVerticalS },
});

/** The list's parameters for the server, from the address. */
function lotParams({ search, page, pageSize, sort }: ListParams): LotListParams {
  const listed = search.get('listed');
  return {
    page,
    pageSize,
    sort: (sort?.key ?? DEFAULT_SORT.key) as ListSort,
    order: (sort ?? DEFAULT_SORT).desc ? 'desc' : 'asc',
    q: search.get('q')?.trim() || undefined,
    status: oneOf(search.get('status'), STATUSES),
    form: oneOf(search.get('form'), LOT_FORMS),
    origin: oneOf(search.get('origin'), ORIGINS),
    technique: oneOf(search.get('technique'), TECHNIQUES),
    listed: listed === 'true' ? true : listed === 'false' ? false : undefined,
    mine: search.get('scope') === 'all' ? undefined : true,
  };
}

function originWords(row: LotSummary): string | undefined {
  return row.origin ? `${ORIGIN_LABEL[row.origin]}${SOURCE_NOTE[row.originSource ?? 'holder']}` : undefined;
}

function useColumns(): Array<ListColumn<LotSummary> & { sort?: ListSort }> {
  const styles = useStyles();
  return [
    {
      id: 'code',
      header: 'Code',
      sort: 'code',
      cell: (row) => <span className={styles.code}>{row.displayCode}</span>,
    },
    {
      id: 'title',
      header: 'Title',
      sort: 'title',
      cell: (row) => <Link to={`/lots/${row.code}`}>{row.title}</Link>,
    },
    { id: 'form', header: 'Form', sort: 'form', cell: (row) => (row.form ? FORM_LABEL[row.form] : '—') },
    { id: 'count', header: 'Count', sort: 'count', descFirst: true, cell: (row) => formatCount(row.count) },
    {
      id: 'origin',
      header: 'Origin',
      sort: 'origin',
      cell: (row) => (
        <>
          {originWords(row) ?? 'No attribution yet'}
          {row.technique ? (
            <Text size={200} block className={styles.sub}>
              {TECHNIQUE_LABELS[row.technique]}
            </Text>
          ) : null}
        </>
      ),
    },
    {
      id: 'period',
      header: 'Period',
      sort: 'period',
      cell: (row) => (row.period ? periodWords({ ...row.period, approximate: false }) : '—'),
    },
    { id: 'status', header: 'Status', sort: 'status', cell: (row) => STATUS_LABEL[row.status] },
    {
      id: 'listed',
      header: 'Listed',
      sort: 'listed',
      descFirst: true,
      cell: (row) => (row.listed ? <Badge appearance="tint">Listed</Badge> : <Text>Unlisted</Text>),
    },
    {
      id: 'updatedAt',
      header: 'Last entry',
      sort: 'updated',
      descFirst: true,
      cell: (row) => <time dateTime={row.updatedAt}>{formatTime(row.updatedAt)}</time>,
    },
  ];
}

/** A lot as a card, in place of the table's row on a phone. */
function LotCard({ lot: r }: { lot: LotSummary }) {
  const styles = useStyles();
  return (
    <Card className={styles.card}>
      <Link to={`/lots/${r.code}`}>
        <Text weight="semibold">{r.title}</Text>
      </Link>
      <Text size={200} className={styles.code}>
        {r.displayCode}
      </Text>
      <Text size={200}>
        {r.form ? FORM_LABEL[r.form] : '—'} · {formatCount(r.count)} beads ·{' '}
        {originWords(r) ?? 'no attribution yet'}
        {r.period ? `, ${periodWords({ ...r.period, approximate: false })}` : ''}
      </Text>
      <Text size={200} className={styles.sub}>
        {STATUS_LABEL[r.status]} · {r.listed ? 'listed' : 'unlisted'} · last entry {formatTime(r.updatedAt)}
      </Text>
    </Card>
  );
}

/** The dealer's inventory: the server pages, sorts and filters; the URL keeps the view. */
export function InventoryPage() {
  const styles = useStyles();
  const { account, isLoading } = useSession();
  const navigate = useNavigate();
  const columns = useColumns();
  // The address may ask for any order a column heading gives.
  const list = useListParams({ sort: DEFAULT_SORT, sorts: columns.flatMap((c) => c.sort ?? []) });
  const { update } = list;
  const params = lotParams(list);
  const [text, setText] = useState(params.q ?? '');
  const query = useQuery({ ...lotsQueries.list(params), enabled: account !== null });

  // Searching as one types, a moment after the last key.
  useEffect(() => {
    if ((params.q ?? '') === text.trim()) return;
    const t = setTimeout(() => update({ q: text.trim() || undefined }), 300);
    return () => clearTimeout(t);
  });

  const total = query.data?.total ?? 0;

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

  const { page: _p, pageSize: _s, ...filters } = params;

  return (
    <Page
      title="Inventory"
      actions={
        <div className={styles.buttons}>
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
      }
    >
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
      ) : (
        <ListView
          label="Lots"
          columns={columns}
          query={query}
          rowKey={(r) => r.code}
          list={list}
          noun={['lot', 'lots']}
          size="small"
          card={(r) => <LotCard lot={r} />}
          empty={
            <Card className={styles.empty}>
              {filtered ? (
                <>
                  <Text>No lot matches these filters.</Text>
                  <Button
                    onClick={() => {
                      setText('');
                      list.clear(params.mine ? {} : { scope: 'all' });
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
          }
        />
      )}
    </Page>
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
