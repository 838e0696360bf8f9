import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Fragment, useState } from 'react';
import { Navigate } from 'react-router-dom';
import { ActionDialog, PanelDialog } from '../../common/ui/ActionDialog';
import { FilterButtons } from '../../common/ui/FilterButtons';
import { fieldError, FormError, NoteField } from '../../common/ui/FormPage';
import { formatDate } from '../../common/ui/format';
import type { ListColumn } from '../../common/ui/list/DataTable';
import { useListParams } from '../../common/ui/list/list-params';
import { ListView, useListStyles } from '../../common/ui/list/ListView';
import { accountsApi, type Applicant, registryQuery, type RegistryParams, useSession } from './accounts.api';
import { ROLE_LABEL } from './labels';
import { Page } from '../../common/ui/Page';

const useStyles = makeStyles({
  facts: {
    display: 'grid',
    gridTemplateColumns: 'max-content minmax(0, 1fr)',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalS,
    margin: 0,
  },
  term: { fontWeight: tokens.fontWeightSemibold },
  detail: { margin: 0, whiteSpace: 'pre-wrap', overflowWrap: 'anywhere' },
});

const STATUSES: Array<{ value: RegistryParams['status']; label: string }> = [
  { value: 'pending', label: 'Waiting' },
  { value: 'verified', label: 'Verified' },
  { value: 'suspended', label: 'Suspended' },
  { value: 'rejected', label: 'Not accepted' },
];
const SORTS = ['business', 'town', 'applied'];

type Action = 'approve' | 'reject' | 'suspend' | 'reinstate';

function ReasonDialog({
  target,
  action,
  onClose,
}: {
  target: Applicant;
  action: 'reject' | 'suspend';
  onClose: () => void;
}) {
  const client = useQueryClient();
  const [reason, setReason] = useState('');
  const decide = useMutation({
    mutationFn: () => accountsApi.decide(target.id, action, reason),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['registry'] });
      onClose();
    },
  });
  const verb = action === 'reject' ? 'Reject' : 'Suspend';
  return (
    <ActionDialog
      title={`${verb} ${target.displayName}`}
      close={onClose}
      onSubmit={() => decide.mutate()}
      submitLabel={verb}
      pending={decide.isPending}
      narrow
    >
      <NoteField
        label="Reason (sent to them by e-mail)"
        required
        value={reason}
        onChange={setReason}
        validationMessage={fieldError(decide.error, 'reason')}
      />
      <FormError error={decide.error} />
    </ActionDialog>
  );
}

/** Asks before a decision that needs no reason: approving or lifting a suspension. */
function ConfirmDialog({
  target,
  action,
  onClose,
}: {
  target: Applicant;
  action: 'approve' | 'reinstate';
  onClose: () => void;
}) {
  const client = useQueryClient();
  const decide = useMutation({
    mutationFn: () => accountsApi.decide(target.id, action),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['registry'] });
      onClose();
    },
  });
  const verb = action === 'approve' ? 'Approve' : 'Lift the suspension of';
  return (
    <ActionDialog
      title={`${verb} ${target.displayName}?`}
      close={onClose}
      onSubmit={() => decide.mutate()}
      submitLabel={action === 'approve' ? 'Approve' : 'Lift the suspension'}
      pending={decide.isPending}
      narrow
    >
      <Text>
        {target.displayName} ({target.business}) can then write to rolls as{' '}
        {ROLE_LABEL[target.role].toLowerCase()}. They are told by e-mail.
      </Text>
      <FormError error={decide.error} />
    </ActionDialog>
  );
}

/** Everything an applicant told the registrar, to read before deciding. */
function ApplicationDialog({ target, onClose }: { target: Applicant; onClose: () => void }) {
  const styles = useStyles();
  const facts: Array<[string, React.ReactNode]> = [
    ['Name', target.displayName],
    ['Applies as', ROLE_LABEL[target.role]],
    ['Handle', `@${target.handle}`],
    ['E-mail', target.email],
    ['Business', target.business],
    ['Address', target.address || 'Not given'],
    ['Town and country', `${target.town}, ${target.country}`],
    [
      'Website',
      target.website ? (
        <a href={target.website} target="_blank" rel="noopener noreferrer nofollow">
          {target.website}
        </a>
      ) : (
        'None given'
      ),
    ],
    ['Trade references', target.tradeReferences || 'Not given'],
    [
      'Document',
      target.document ? (
        <a href={`/api/registry/accounts/${target.id}/document`} download={target.document.name}>
          Download {target.document.name} ({documentSize(target.document.size)})
        </a>
      ) : (
        'None sent'
      ),
    ],
    ['Applied', formatDate(target.appliedAt)],
  ];
  return (
    <PanelDialog title={`Application of ${target.displayName}`} close={onClose}>
      <dl className={styles.facts}>
        {facts.map(([term, detail]) => (
          <Fragment key={term}>
            <dt className={styles.term}>{term}</dt>
            <dd className={styles.detail}>{detail}</dd>
          </Fragment>
        ))}
      </dl>
    </PanelDialog>
  );
}

function Decisions({ row, onDialog }: { row: Applicant; onDialog: (a: Action | 'read') => void }) {
  const styles = useListStyles();
  return (
    <div className={styles.actions}>
      <Button size="small" onClick={() => onDialog('read')}>
        Read the application
      </Button>
      {row.status === 'pending' || row.status === 'rejected' ? (
        <Button appearance="primary" size="small" onClick={() => onDialog('approve')}>
          Approve…
        </Button>
      ) : null}
      {row.status === 'pending' ? (
        <Button size="small" onClick={() => onDialog('reject')}>
          Reject…
        </Button>
      ) : null}
      {row.status === 'verified' ? (
        <Button size="small" onClick={() => onDialog('suspend')}>
          Suspend…
        </Button>
      ) : null}
      {row.status === 'suspended' ? (
        <Button size="small" onClick={() => onDialog('reinstate')}>
          Lift suspension…
        </Button>
      ) : null}
    </div>
  );
}

function useColumns(
  onDialog: (target: Applicant, action: Action | 'read') => void,
): Array<ListColumn<Applicant>> {
  const styles = useListStyles();
  return [
    {
      id: 'applicant',
      header: 'Applicant',
      cell: (a) => (
        <div>
          <Text weight="semibold">{a.displayName}</Text>
          <div className={styles.sub}>
            {ROLE_LABEL[a.role]} · @{a.handle} · {a.email}
          </div>
        </div>
      ),
    },
    {
      id: 'business',
      header: 'Business',
      sort: 'business',
      cell: (a) => (
        <div>
          {a.business}
          {a.address ? <div className={styles.sub}>{a.address}</div> : null}
        </div>
      ),
    },
    { id: 'town', header: 'Town', sort: 'town', cell: (a) => a.town },
    { id: 'country', header: 'Country', cell: (a) => a.country },
    { id: 'applied', header: 'Applied', sort: 'applied', cell: (a) => formatDate(a.appliedAt) },
    {
      id: 'actions',
      header: 'Decision',
      cell: (a) => <Decisions row={a} onDialog={(action) => onDialog(a, action)} />,
    },
  ];
}

/** The registrar's verification queue, and the accounts by status, as a server-paged table. */
export function RegistryPage() {
  const styles = useListStyles();
  const { account, isLoading } = useSession();
  const list = useListParams({ sort: { key: 'applied', desc: false }, sorts: SORTS });
  const [dialog, setDialog] = useState<{ target: Applicant; action: Action | 'read' } | null>(null);
  const columns = useColumns((target, action) => setDialog({ target, action }));
  const status = (STATUSES.find((s) => s.value === list.search.get('status'))?.value ??
    'pending') as RegistryParams['status'];
  const sort = list.sort ? `${list.sort.desc ? '-' : ''}${list.sort.key}` : 'applied';
  const query = useQuery({
    ...registryQuery({ status, sort, page: list.page, pageSize: list.pageSize }),
    enabled: account?.role === 'registrar',
  });

  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to="/sign-in?next=/registry" replace />;
  if (account.role !== 'registrar') return <Text>Only the registrar can see this page.</Text>;

  return (
    <Page title="Account verification">
      <div className={styles.tabs}>
        <FilterButtons
          label="Accounts by status"
          value={status}
          options={STATUSES}
          onChange={(v) => list.update({ status: String(v) })}
        />
      </div>
      <ListView
        label="Accounts"
        columns={columns}
        query={query}
        list={list}
        noun={['account', 'accounts']}
        empty="No accounts here."
      />
      {dialog?.action === 'reject' || dialog?.action === 'suspend' ? (
        <ReasonDialog target={dialog.target} action={dialog.action} onClose={() => setDialog(null)} />
      ) : null}
      {dialog?.action === 'approve' || dialog?.action === 'reinstate' ? (
        <ConfirmDialog target={dialog.target} action={dialog.action} onClose={() => setDialog(null)} />
      ) : null}
      {dialog?.action === 'read' ? (
        <ApplicationDialog target={dialog.target} onClose={() => setDialog(null)} />
      ) : null}
    </Page>
  );
}

/** A file size in words: kB up to a megabyte, then MB with one decimal. */
function documentSize(bytes: number): string {
  return bytes < 1024 * 1024
    ? `${Math.max(1, Math.round(bytes / 1024))} kB`
    : `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
