import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  Field,
  makeStyles,
  Table,
  TableBody,
  TableCell,
  TableHeader,
  TableHeaderCell,
  TableRow,
  Text,
  Textarea,
  Title2,
  tokens,
} from '@fluentui/react-components';
import { FilterButtons } from '../../shared/ui/FilterButtons';
import { formatLotCode } from '@beadroll/core';
import { createColumnHelper, tableFeatures, useTable } from '@tanstack/react-table';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { fieldError, FormError } from '../../shared/ui/FormPage';
import { formatDate } from '../../shared/ui/format';
import { REPORT_CATEGORY_LABEL, registryToolsApi, reportsQuery, type Report } from './registry.api';
import { RegistrarOnly } from './RegistrarOnly';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL },
  scroller: { overflowX: 'auto' },
  table: { minWidth: '760px' },
  pager: { display: 'flex', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  text: { whiteSpace: 'pre-wrap', maxWidth: '28rem' },
});

const PAGE_SIZE = 20;
const features = tableFeatures({});
const helper = createColumnHelper<typeof features, Report>();
const columns = helper.columns([
  helper.accessor('createdAt', { header: 'Received' }),
  helper.accessor('lot', { header: 'Lot' }),
  helper.accessor('category', { header: 'Problem' }),
  helper.accessor('text', { header: 'What they wrote' }),
  helper.accessor('status', { header: 'Status' }),
  helper.display({ id: 'actions', header: 'Answer' }),
]);
const EMPTY: Report[] = [];

function CloseDialog({ report, onClose }: { report: Report; onClose: () => void }) {
  const client = useQueryClient();
  const [resolution, setResolution] = useState('');
  const close = useMutation({
    mutationFn: () => registryToolsApi.closeReport(report.id, resolution),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['registry', 'reports'] });
      onClose();
    },
  });
  return (
    <Dialog open onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface>
        <form
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            close.mutate();
          }}
        >
          <DialogBody>
            <DialogTitle>Close the report on lot {formatLotCode(report.lot)}</DialogTitle>
            <DialogContent>
              <Field
                label={report.answerWanted ? 'What was done (e-mailed to the reporter)' : 'What was done'}
                required
                validationMessage={fieldError(close.error, 'resolution')}
              >
                <Textarea value={resolution} onChange={(_, d) => setResolution(d.value)} resize="vertical" />
              </Field>
              <FormError error={close.error} />
            </DialogContent>
            <DialogActions>
              <Button onClick={onClose}>Cancel</Button>
              <Button appearance="primary" type="submit" disabled={close.isPending}>
                Close the report
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
  );
}

/** The registrar's queue of reports from public pages, as a server-paged table. */
export function ReportsPage() {
  return (
    <RegistrarOnly>
      <Reports />
    </RegistrarOnly>
  );
}

function Reports() {
  const styles = useStyles();
  const [search, setSearch] = useSearchParams();
  const [closing, setClosing] = useState<Report | null>(null);
  const status = search.get('status') === 'closed' ? 'closed' : 'open';
  const page = Math.max(1, Number(search.get('page')) || 1);
  const query = useQuery(reportsQuery({ status, page, pageSize: PAGE_SIZE }));
  const table = useTable({ features, columns, data: query.data?.items ?? EMPTY });
  const total = query.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const update = (changes: Record<string, string>) => {
    const next = new URLSearchParams(search);
    for (const [k, v] of Object.entries(changes)) next.set(k, v);
    setSearch(next, { replace: true });
  };
  const cell = (r: Report, id: string) => {
    switch (id) {
      case 'createdAt':
        return formatDate(r.createdAt);
      case 'lot':
        return (
          <a href={`/l/${r.lot}`} target="_blank" rel="noreferrer">
            {formatLotCode(r.lot)}
          </a>
        );
      case 'category':
        return REPORT_CATEGORY_LABEL[r.category];
      case 'text':
        return <div className={styles.text}>{r.text}</div>;
      case 'status':
        return r.status === 'open' ? 'Open' : `Closed ${formatDate(r.closedAt)}: ${r.resolution ?? ''}`;
      default:
        return r.status === 'open' ? (
          <Button size="small" onClick={() => setClosing(r)}>
            Answer and close…
          </Button>
        ) : null;
    }
  };
  return (
    <section className={styles.page} aria-labelledby="reports-title">
      <Title2 as="h1" id="reports-title">
        Reports from public pages
      </Title2>
      <FilterButtons
        label="Reports by status"
        value={status}
        options={[
          { value: 'open', label: 'Open' },
          { value: 'closed', label: 'Closed' },
        ]}
        onChange={(v) => update({ status: String(v), page: '1' })}
      />
      <div className={styles.scroller}>
        <Table className={styles.table} aria-label="Reports">
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
      {query.data && total === 0 && <Text>No {status} reports.</Text>}
      <div className={styles.pager}>
        <Button disabled={page <= 1} onClick={() => update({ page: String(page - 1) })}>
          Previous
        </Button>
        <Text>
          Page {page} of {pages}
        </Text>
        <Button disabled={page >= pages} onClick={() => update({ page: String(page + 1) })}>
          Next
        </Button>
      </div>
      {closing && <CloseDialog report={closing} onClose={() => setClosing(null)} />}
    </section>
  );
}
