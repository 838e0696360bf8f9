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
import { FilterButtons } from '../../lib/FilterButtons';
import { createColumnHelper, tableFeatures, useTable } from '@tanstack/react-table';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Navigate, useSearchParams } from 'react-router-dom';
import { accountsApi, type Applicant, registryQuery, type RegistryParams, useSession } from './accounts.api';
import { fieldError, FormError } from './FormPage';
import { formatDate, ROLE_LABEL } from './labels';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL },
  scroller: { overflowX: 'auto' },
  table: { minWidth: '760px' },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
  pager: { display: 'flex', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  sub: { color: tokens.colorNeutralForeground3 },
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

function Decisions({ row, onReason }: { row: Applicant; onReason: (a: 'reject' | 'suspend') => void }) {
  const styles = useStyles();
  const client = useQueryClient();
  const decide = useMutation({
    mutationFn: (action: Action) => accountsApi.decide(row.id, action),
    onSuccess: () => client.invalidateQueries({ queryKey: ['registry'] }),
  });
  return (
    <div className={styles.actions}>
      {row.status === 'pending' || row.status === 'rejected' ? (
        <Button appearance="primary" size="small" onClick={() => decide.mutate('approve')}>
          Approve
        </Button>
      ) : null}
      {row.status === 'pending' ? (
        <Button size="small" onClick={() => onReason('reject')}>
          Reject…
        </Button>
      ) : null}
      {row.status === 'verified' ? (
        <Button size="small" onClick={() => onReason('suspend')}>
          Suspend…
        </Button>
      ) : null}
      {row.status === 'suspended' ? (
        <Button size="small" onClick={() => decide.mutate('reinstate')}>
          Lift suspension
        </Button>
      ) : null}
      {decide.error ? <FormError error={decide.error} /> : null}
    </div>
  );
}

const EMPTY: Applicant[] = [];

/** The registrar's verification queue, and the accounts by status, as a server-paged table. */
export function RegistryPage() {
  const styles = useStyles();
  const { account, isLoading } = useSession();
  const [search, setSearch] = useSearchParams();
  const [dialog, setDialog] = useState<{ target: Applicant; action: 'reject' | 'suspend' } | null>(null);
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
                  <TableCell>{a.business}</TableCell>
                  <TableCell>{a.town}</TableCell>
                  <TableCell>{a.country}</TableCell>
                  <TableCell>{formatDate(a.appliedAt)}</TableCell>
                  <TableCell>
                    <Decisions row={a} onReason={(action) => setDialog({ target: a, action })} />
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
      {dialog ? <ReasonDialog {...dialog} onClose={() => setDialog(null)} /> : null}
    </section>
  );
}
