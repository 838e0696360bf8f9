import { formatLotCode } from '@beadroll/core';
import { Button, makeStyles, Text } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { FilterButtons } from '../../common/ui/FilterButtons';
import { fieldError, FormError, NoteField } from '../../common/ui/FormPage';
import { formatDate } from '../../common/ui/format';
import type { ListColumn } from '../../common/ui/list/DataTable';
import { useListParams } from '../../common/ui/list/list-params';
import { ListView, useListStyles } from '../../common/ui/list/ListView';
import { REPORT_CATEGORY_LABEL, registryToolsApi, reportsQuery, type Report } from './registry.api';
import { RegistrarOnly } from './RegistrarOnly';
import { Page } from '../../common/ui/Page';

const useStyles = makeStyles({
  text: { whiteSpace: 'pre-wrap', maxWidth: '28rem' },
});

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
    <ActionDialog
      title={`Close the report on lot ${formatLotCode(report.lot)}`}
      close={onClose}
      onSubmit={() => close.mutate()}
      submitLabel="Close the report"
      pending={close.isPending}
      narrow
    >
      <NoteField
        label={report.answerWanted ? 'What was done (e-mailed to the reporter)' : 'What was done'}
        required
        value={resolution}
        onChange={setResolution}
        validationMessage={fieldError(close.error, 'resolution')}
      />
      <FormError error={close.error} />
    </ActionDialog>
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

function Reports() {
  const styles = useListStyles();
  const list = useListParams();
  const [closing, setClosing] = useState<Report | null>(null);
  const columns = useColumns(setClosing);
  const status = list.search.get('status') === 'closed' ? 'closed' : 'open';
  const query = useQuery(reportsQuery({ status, page: list.page, pageSize: list.pageSize }));
  return (
    <Page title="Reports from public pages">
      <div className={styles.tabs}>
        <FilterButtons
          label="Reports by status"
          value={status}
          options={[
            { value: 'open', label: 'Open' },
            { value: 'closed', label: 'Closed' },
          ]}
          onChange={(v) => list.update({ status: v === 'open' ? undefined : v })}
        />
      </div>
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
