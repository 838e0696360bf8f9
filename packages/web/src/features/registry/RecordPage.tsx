import { Link, makeStyles, Text, tokens } from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import type { ListColumn } from '../../common/ui/list/DataTable';
import { useListParams } from '../../common/ui/list/list-params';
import { ListView, useListStyles } from '../../common/ui/list/ListView';
import { actionsQuery, type RegistrarAction } from './registry.api';
import { Page } from '../../common/ui/Page';

const useStyles = makeStyles({
  row: { display: 'flex', gap: tokens.spacingHorizontalL, alignItems: 'center', flexWrap: 'wrap' },
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
const columns: Array<ListColumn<RegistrarAction>> = [
  { id: 'at', header: 'When', cell: (a) => new Date(a.at).toLocaleString() },
  { id: 'action', header: 'What', cell: (a) => ACTION_LABEL[a.action] ?? a.action },
  { id: 'subject', header: 'About', cell: (a) => <code>{a.subject}</code> },
  { id: 'reason', header: 'Why', cell: (a) => a.reason ?? '—' },
  { id: 'actor', header: 'Registrar', cell: (a) => <code>{a.actor}</code> },
];

/** The registrar's record of decisions (append-only), with JSON and CSV export. */
export function RecordPage() {
  const styles = useStyles();
  const listStyles = useListStyles();
  const list = useListParams({ pageSize: PAGE_SIZE });
  const query = useQuery(actionsQuery({ page: list.page, pageSize: list.pageSize }));
  return (
    <Page title="Registrar’s record">
      <Text className={listStyles.sub}>
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
      <ListView
        label="Registrar’s record"
        columns={columns}
        query={query}
        list={list}
        noun={['decision', 'decisions']}
        empty="Nothing on the record yet."
      />
    </Page>
  );
}
