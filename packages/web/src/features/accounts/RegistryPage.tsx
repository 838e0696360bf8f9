import { Button, Text } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ActionDialog, PanelDialog } from '../../common/ui/ActionDialog';
import { NoteField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
import { formatDate } from '../../common/ui/format';
import type { ListColumn } from '../../common/ui/list/DataTable';
import { filterValue, type FilterOption, useListParams } from '../../common/ui/list/list-params';
import { ListFilter, ListView, useListStyles } from '../../common/ui/list/ListView';
import { accountsApi, type Applicant, registryQuery, type RegistryParams } from './accounts.api';
import { ROLE_LABEL } from './labels';
import { Page } from '../../common/ui/Page';
import { type Fact, Facts } from '../../common/ui/Facts';

const STATUSES: Array<FilterOption<RegistryParams['status']>> = [
  { value: 'pending', label: 'Waiting' },
  { value: 'verified', label: 'Verified' },
  { value: 'suspended', label: 'Suspended' },
  { value: 'rejected', label: 'Not accepted' },
];
const SORTS = ['business', 'town', 'applied'];

type Action = 'approve' | 'reject' | 'suspend' | 'reinstate';

/** What each decision asks: its title, its button, and whether it needs a reason (e-mailed to them). */
const DECISIONS: Record<Action, { title: string; submit: string; reason: boolean }> = {
  approve: { title: 'Approve', submit: 'Approve', reason: false },
  reinstate: { title: 'Lift the suspension of', submit: 'Lift the suspension', reason: false },
  reject: { title: 'Reject', submit: 'Reject', reason: true },
  suspend: { title: 'Suspend', submit: 'Suspend', reason: true },
};

/**
 * Asks before a decision: rejecting or suspending takes a reason, sent to them by e-mail;
 * approving or lifting a suspension only asks to confirm.
 */
function DecisionDialog({
  target,
  action,
  onClose,
}: {
  target: Applicant;
  action: Action;
  onClose: () => void;
}) {
  const client = useQueryClient();
  const form = useFormValues({ reason: '' });
  const words = DECISIONS[action];
  const decide = useMutation({
    mutationFn: () => accountsApi.decide(target.id, action, words.reason ? form.values.reason : undefined),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['registry'] });
      onClose();
    },
  });
  return (
    <ActionDialog
      title={`${words.title} ${target.displayName}${words.reason ? '' : '?'}`}
      close={onClose}
      onSubmit={() => decide.mutate()}
      submitLabel={words.submit}
      pending={decide.isPending}
      error={decide.error}
      narrow
    >
      {words.reason ? (
        <NoteField label="Reason (sent to them by e-mail)" required {...form.bind(decide.error)('reason')} />
      ) : (
        <Text>
          {target.displayName} ({target.business}) can then write to rolls as{' '}
          {ROLE_LABEL[target.role].toLowerCase()}. They are told by e-mail.
        </Text>
      )}
    </ActionDialog>
  );
}

/** Everything an applicant told the registrar, to read before deciding. */
function ApplicationDialog({ target, onClose }: { target: Applicant; onClose: () => void }) {
  const facts: Fact[] = [
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
      <Facts rows={facts} />
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
  const list = useListParams({ sort: { key: 'applied', desc: false }, sorts: SORTS });
  const [dialog, setDialog] = useState<{ target: Applicant; action: Action | 'read' } | null>(null);
  const columns = useColumns((target, action) => setDialog({ target, action }));
  const status = filterValue(list, 'status', STATUSES);
  const sort = list.sort ? `${list.sort.desc ? '-' : ''}${list.sort.key}` : 'applied';
  const query = useQuery(registryQuery({ status, sort, page: list.page, pageSize: list.pageSize }));
  return (
    <Page title="Account verification">
      <ListFilter list={list} name="status" label="Accounts by status" options={STATUSES} />
      <ListView
        label="Accounts"
        columns={columns}
        query={query}
        list={list}
        noun={['account', 'accounts']}
        empty="No accounts here."
      />
      {dialog?.action === 'read' ? (
        <ApplicationDialog target={dialog.target} onClose={() => setDialog(null)} />
      ) : dialog ? (
        <DecisionDialog target={dialog.target} action={dialog.action} onClose={() => setDialog(null)} />
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
