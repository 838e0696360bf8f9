import { formatLotCode } from '@beadroll/core';
import { Button, makeStyles, Text } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { NoteField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
import { formatDate } from '../../common/ui/format';
import type { ListColumn } from '../../common/ui/list/DataTable';
import { filterValue, type FilterOption, useListParams } from '../../common/ui/list/list-params';
import { ListFilter, ListView } from '../../common/ui/list/ListView';
import { REPORT_CATEGORY_LABEL, registryToolsApi, reportsQuery, type Report } from './registry.api';
import { Page } from '../../common/ui/Page';

const useStyles = makeStyles({
  text: { whiteSpace: 'pre-wrap', maxWidth: '28rem' },
});

const STATUSES: Array<FilterOption<'open' | 'closed'>> = [
  { value: 'open', label: 'Open' },
  { value: 'closed', label: 'Closed' },
];

function CloseDialog({ report, onClose }: { report: Report; onClose: () => void }) {
  const client = useQueryClient();
  const form = useFormValues({ resolution: '' });
  const close = useMutation({
    mutationFn: () => registryToolsApi.closeReport(report.id, form.values.resolution),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['registry', 'reports'] });
      onClose();
    },
  });
  return (
    <ActionDialog
      title={`Close the report on lot ${formatLotCode(report.lot)}`}
      close={onClose}
      onSubmit={() => close.mutate()}
      submitLabel="Close the report"
      pending={close.isPending}
      error={close.error}
      narrow
    >
      <NoteField
        label={report.answerWanted ? 'What was done (e-mailed to the reporter)' : 'What was done'}
        required
        {...form.bind(close.error)('resolution')}
      />
    </ActionDialog>
  );
}

function useColumns(onClose: (r: Report) => void): Array<ListColumn<Report>> {
  const styles = useStyles();
  return [
    { id: 'createdAt', header: 'Received', cell: (r) => formatDate(r.createdAt) },
    {
      id: 'lot',
      header: 'Lot',
      cell: (r) => (
        <a href={`/l/${r.lot}`} target="_blank" rel="noreferrer">
          {formatLotCode(r.lot)}
        </a>
      ),
    },
    { id: 'category', header: 'Problem', cell: (r) => REPORT_CATEGORY_LABEL[r.category] },
    { id: 'text', header: 'What they wrote', cell: (r) => <div className={styles.text}>{r.text}</div> },
    {
      id: 'status',
      header: 'Status',
      cell: (r) => (r.status === 'open' ? 'Open' : `Closed ${formatDate(r.closedAt)}: ${r.resolution ?? ''}`),
    },
    {
      id: 'actions',
      header: 'Answer',
      cell: (r) =>
        r.status === 'open' ? (
          <Button size="small" onClick={() => onClose(r)}>
            Answer and close…
          </Button>
        ) : null,
    },
  ];
}

/** The registrar's queue of reports from public pages, as a server-paged table. */
export function ReportsPage() {
  const list = useListParams();
  const [closing, setClosing] = useState<Report | null>(null);
  const columns = useColumns(setClosing);
  const status = filterValue(list, 'status', STATUSES);
  const query = useQuery(reportsQuery({ status, page: list.page, pageSize: list.pageSize }));
  return (
    <Page title="Reports from public pages">
      <ListFilter list={list} name="status" label="Reports by status" options={STATUSES} />
      <ListView
        label="Reports"
        columns={columns}
        query={query}
        list={list}
        noun={['report', 'reports']}
        empty={<Text>No {status} reports.</Text>}
      />
      {closing && <CloseDialog report={closing} onClose={() => setClosing(null)} />}
    </Page>
  );
}
