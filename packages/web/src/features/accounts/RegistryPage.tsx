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
import { createColumnHelper, tableFeatures, useTable } from '@tanstack/react-table';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Fragment, useState } from 'react';
import { Navigate, useSearchParams } from 'react-router-dom';
import { accountsApi, type Applicant, registryQuery, type RegistryParams, useSession } from './accounts.api';
import { fieldError, FormError } from '../../shared/ui/FormPage';
import { formatDate } from '../../shared/ui/format';
import { ROLE_LABEL } from './labels';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL },
  scroller: { overflowX: 'auto' },
  table: { minWidth: '760px' },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
  pager: { display: 'flex', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  sub: { color: tokens.colorNeutralForeground3 },
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
const PAGE_SIZE = 20;
const SORTABLE: Record<string, string> = { business: 'business', town: 'town', appliedAt: 'applied' };

type Action = 'approve' | 'reject' | 'suspend' | 'reinstate';
const features = tableFeatures({});
const helper = createColumnHelper<typeof features, Applicant>();
const columns = helper.columns([
  helper.accessor('displayName', { header: 'Applicant' }),
  helper.accessor('business', { header: 'Business' }),
  helper.accessor('town', { header: 'Town' }),
  helper.accessor('country', { header: 'Country' }),
  helper.accessor('appliedAt', { header: 'Applied' }),
  helper.display({ id: 'actions', header: 'Decision' }),
]);

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
    <Dialog open onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface>
        <form
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            decide.mutate();
          }}
        >
          <DialogBody>
            <DialogTitle>
              {verb} {target.displayName}
            </DialogTitle>
            <DialogContent>
              <Field
                label="Reason (sent to them by e-mail)"
                required
                validationMessage={fieldError(decide.error, 'reason')}
              >
                <Textarea value={reason} onChange={(_, d) => setReason(d.value)} resize="vertical" />
              </Field>
              <FormError error={decide.error} />
            </DialogContent>
            <DialogActions>
              <Button onClick={onClose}>Cancel</Button>
              <Button appearance="primary" type="submit" disabled={decide.isPending}>
                {verb}
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
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
    <Dialog open onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface>
        <DialogBody>
          <DialogTitle>
            {verb} {target.displayName}?
          </DialogTitle>
          <DialogContent>
            <Text>
              {target.displayName} ({target.business}) can then write to rolls as{' '}
              {ROLE_LABEL[target.role].toLowerCase()}. They are told by e-mail.
            </Text>
            <FormError error={decide.error} />
          </DialogContent>
          <DialogActions>
            <Button onClick={onClose}>Cancel</Button>
            <Button appearance="primary" onClick={() => decide.mutate()} disabled={decide.isPending}>
              {action === 'approve' ? 'Approve' : 'Lift the suspension'}
            </Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
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
    ['Applied', formatDate(target.appliedAt)],
  ];
  return (
    <Dialog open onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface>
        <DialogBody>
          <DialogTitle>Application of {target.displayName}</DialogTitle>
          <DialogContent>
            <dl className={styles.facts}>
              {facts.map(([term, detail]) => (
                <Fragment key={term}>
                  <dt className={styles.term}>{term}</dt>
                  <dd className={styles.detail}>{detail}</dd>
                </Fragment>
              ))}
            </dl>
          </DialogContent>
          <DialogActions>
            <Button appearance="primary" onClick={onClose}>
              Close
            </Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );
}

function Decisions({ row, onDialog }: { row: Applicant; onDialog: (a: Action | 'read') => void }) {
  const styles = useStyles();
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

const EMPTY: Applicant[] = [];

/** The registrar's verification queue, and the accounts by status, as a server-paged table. */
export function RegistryPage() {
  const styles = useStyles();
  const { account, isLoading } = useSession();
  const [search, setSearch] = useSearchParams();
  const [dialog, setDialog] = useState<{ target: Applicant; action: Action | 'read' } | null>(null);
  const status = (STATUSES.find((s) => s.value === search.get('status'))?.value ??
    'pending') as RegistryParams['status'];
  const sort = search.get('sort') ?? 'applied';
  const page = Math.max(1, Number(search.get('page')) || 1);
  const query = useQuery({
    ...registryQuery({ status, sort, page, pageSize: PAGE_SIZE }),
    enabled: account?.role === 'registrar',
  });
  const table = useTable({ features, columns, data: query.data?.items ?? EMPTY });

  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to="/sign-in?next=/registry" replace />;
  if (account.role !== 'registrar') return <Text>Only the registrar can see this page.</Text>;

  const update = (changes: Record<string, string>) => {
    const next = new URLSearchParams(search);
    for (const [k, v] of Object.entries(changes)) next.set(k, v);
    setSearch(next, { replace: true });
  };
  const total = query.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));

  return (
    <section className={styles.page} aria-labelledby="registry-title">
      <Title2 as="h1" id="registry-title">
        Account verification
      </Title2>
      <FilterButtons
        label="Accounts by status"
        value={status}
        options={STATUSES}
        onChange={(v) => update({ status: String(v), page: '1' })}
      />
      <div className={styles.scroller}>
        <Table className={styles.table} aria-label="Accounts">
          <TableHeader>
            {table.getHeaderGroups().map((group) => (
              <TableRow key={group.id}>
                {group.headers.map((header) => {
                  const key = SORTABLE[header.column.id];
                  const dir = sort === key ? 'ascending' : sort === `-${key}` ? 'descending' : undefined;
                  return (
                    <TableHeaderCell
                      key={header.id}
                      sortable={Boolean(key)}
                      sortDirection={dir}
                      onClick={
                        key ? () => update({ sort: sort === key ? `-${key}` : key, page: '1' }) : undefined
                      }
                    >
                      <table.FlexRender header={header} />
                    </TableHeaderCell>
                  );
                })}
              </TableRow>
            ))}
          </TableHeader>
          <TableBody>
            {table.getRowModel().rows.map((row) => {
              const a = row.original;
              return (
                <TableRow key={row.id}>
                  <TableCell>
                    <div>
                      <Text weight="semibold">{a.displayName}</Text>
                      <div className={styles.sub}>
                        {ROLE_LABEL[a.role]} · @{a.handle} · {a.email}
                      </div>
                    </div>
                  </TableCell>
                  <TableCell>
                    <div>
                      {a.business}
                      {a.address ? <div className={styles.sub}>{a.address}</div> : null}
                    </div>
                  </TableCell>
                  <TableCell>{a.town}</TableCell>
                  <TableCell>{a.country}</TableCell>
                  <TableCell>{formatDate(a.appliedAt)}</TableCell>
                  <TableCell>
                    <Decisions row={a} onDialog={(action) => setDialog({ target: a, action })} />
                  </TableCell>
                </TableRow>
              );
            })}
          </TableBody>
        </Table>
      </div>
      {query.data && total === 0 ? <Text>No accounts here.</Text> : null}
      <div className={styles.pager}>
        <Button disabled={page <= 1} onClick={() => update({ page: String(page - 1) })}>
          Previous
        </Button>
        <Text>
          Page {page} of {pages} · {total} accounts
        </Text>
        <Button disabled={page >= pages} onClick={() => update({ page: String(page + 1) })}>
          Next
        </Button>
      </div>
      {dialog?.action === 'reject' || dialog?.action === 'suspend' ? (
        <ReasonDialog target={dialog.target} action={dialog.action} onClose={() => setDialog(null)} />
      ) : null}
      {dialog?.action === 'approve' || dialog?.action === 'reinstate' ? (
        <ConfirmDialog target={dialog.target} action={dialog.action} onClose={() => setDialog(null)} />
      ) : null}
      {dialog?.action === 'read' ? (
        <ApplicationDialog target={dialog.target} onClose={() => setDialog(null)} />
      ) : null}
    </section>
  );
}
