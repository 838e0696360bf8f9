import {
  Button,
  Link,
  makeStyles,
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
import { createColumnHelper, tableFeatures, useTable } from '@tanstack/react-table';
import { useQuery } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import { actionsQuery, type RegistrarAction } from './registry.api';
import { RegistrarOnly } from './RegistrarOnly';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL },
  scroller: { overflowX: 'auto' },
  table: { minWidth: '760px' },
  row: { display: 'flex', gap: tokens.spacingHorizontalL, alignItems: 'center', flexWrap: 'wrap' },
  sub: { color: tokens.colorNeutralForeground3 },
});

const ACTION_LABEL: Record<string, string> = {
  approved: 'Verified an account',
  rejected: 'Did not accept an application',
  suspended: 'Suspended an account',
  reinstated: 'Lifted a suspension',
  redacted: 'Removed an entry’s contents',
  'redaction-declined': 'Declined a removal request',
  'report-closed': 'Answered a report',
};

const PAGE_SIZE = 50;
const features = tableFeatures({});
const helper = createColumnHelper<typeof features, RegistrarAction>();
const columns = helper.columns([
  helper.accessor('at', { header: 'When' }),
  helper.accessor('action', { header: 'What' }),
  helper.accessor('subject', { header: 'About' }),
  helper.accessor('reason', { header: 'Why' }),
  helper.accessor('actor', { header: 'Registrar' }),
]);
const EMPTY: RegistrarAction[] = [];

/** The registrar's record of decisions (append-only), with JSON and CSV export. */
export function RecordPage() {
  return (
    <RegistrarOnly>
      <Record />
    </RegistrarOnly>
  );
}

function Record() {
  const styles = useStyles();
  const [search, setSearch] = useSearchParams();
  const page = Math.max(1, Number(search.get('page')) || 1);
  const query = useQuery(actionsQuery({ page, pageSize: PAGE_SIZE }));
  const table = useTable({ features, columns, data: query.data?.items ?? EMPTY });
  const pages = Math.max(1, Math.ceil((query.data?.total ?? 0) / PAGE_SIZE));
  const go = (p: number) => setSearch(new URLSearchParams({ page: String(p) }), { replace: true });
  const cell = (a: RegistrarAction, id: string) => {
    if (id === 'at') return new Date(a.at).toLocaleString();
    if (id === 'action') return ACTION_LABEL[a.action] ?? a.action;
    if (id === 'reason') return a.reason ?? '—';
    return <code>{a[id as 'subject' | 'actor']}</code>;
  };
  return (
    <section className={styles.page} aria-labelledby="record-title">
      <Title2 as="h1" id="record-title">
        Registrar’s record
      </Title2>
      <Text className={styles.sub}>
        Every verification decision, suspension, redaction and answered report, kept append-only: nothing here
        can be changed or deleted.
      </Text>
      <div className={styles.row}>
        <Link href="/api/registry/actions/export?format=json" download>
          Download as JSON
        </Link>
        <Link href="/api/registry/actions/export?format=csv" download>
          Download as CSV
        </Link>
      </div>
      <div className={styles.scroller}>
        <Table className={styles.table} aria-label="Registrar’s record">
          <TableHeader>
            {table.getHeaderGroups().map((g) => (
              <TableRow key={g.id}>
                {g.headers.map((h) => (
                  <TableHeaderCell key={h.id}>
                    <table.FlexRender header={h} />
                  </TableHeaderCell>
                ))}
              </TableRow>
            ))}
          </TableHeader>
          <TableBody>
            {table.getRowModel().rows.map((row) => (
              <TableRow key={row.original.id}>
                {row.getAllCells().map((c) => (
                  <TableCell key={c.id}>{cell(row.original, c.column.id)}</TableCell>
                ))}
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </div>
      {query.data?.total === 0 && <Text>Nothing on the record yet.</Text>}
      <div className={styles.row}>
        <Button disabled={page <= 1} onClick={() => go(page - 1)}>
          Previous
        </Button>
        <Text>
          Page {page} of {pages}
        </Text>
        <Button disabled={page >= pages} onClick={() => go(page + 1)}>
          Next
        </Button>
      </div>
    </section>
  );
}
