import {
  Button,
  Dropdown,
  Field,
  Input,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Option,
  Text,
  Textarea,
  Title3,
  tokens,
} from '@fluentui/react-components';
import { formatLotCode } from '@beadroll/core';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { fieldError, Form, FormError } from '../../common/ui/FormPage';
import { formatDate } from '../../common/ui/format';
import { DataTable, type ListColumn } from '../../common/ui/list/DataTable';
import {
  REDACTION_REASON_LABEL,
  redactionRequestsQuery,
  registryToolsApi,
  type RedactionReason,
  type RedactionRequest,
} from './registry.api';
import { Page } from '../../common/ui/Page';

const useStyles = makeStyles({
  form: { display: 'grid', gap: tokens.spacingVerticalM, maxWidth: '32rem' },
  row: { display: 'flex', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
  sub: { color: tokens.colorNeutralForeground3 },
});

const REASONS = Object.keys(REDACTION_REASON_LABEL) as RedactionReason[];

function RedactForm() {
  const styles = useStyles();
  const client = useQueryClient();
  const [lot, setLot] = useState('');
  const [seq, setSeq] = useState('');
  const [reason, setReason] = useState<RedactionReason | ''>('');
  const [note, setNote] = useState('');
  const redact = useMutation({
    mutationFn: () =>
      registryToolsApi.redact({
        lot: lot.trim(),
        seq: Number(seq),
        reason: reason as RedactionReason,
        ...(note.trim() ? { note: note.trim() } : {}),
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['registry'] }),
  });
  return (
    <Form className={styles.form} onSubmit={() => redact.mutate()}>
      <Title3 as="h2">Remove an entry’s contents</Title3>
      <Text className={styles.sub}>
        A redacted entry goes on the lot’s roll naming the entry and the reason; the contents (and an
        exhibit’s files) are deleted, their fingerprints stay and the roll still checks out. The same files
        cannot be uploaded again. This cannot be undone.
      </Text>
      <Field label="Lot code" required validationMessage={fieldError(redact.error, 'lot')}>
        <Input value={lot} onChange={(_, d) => setLot(d.value)} placeholder="XXXX-XXXX-X" />
      </Field>
      <Field label="Entry number (seq)" required validationMessage={fieldError(redact.error, 'seq')}>
        <Input type="number" min={1} value={seq} onChange={(_, d) => setSeq(d.value)} />
      </Field>
      <Field label="Reason" required validationMessage={fieldError(redact.error, 'reason')}>
        <Dropdown
          placeholder="Choose a reason"
          value={reason ? REDACTION_REASON_LABEL[reason] : ''}
          selectedOptions={reason ? [reason] : []}
          onOptionSelect={(_, d) => setReason((d.optionValue as RedactionReason) ?? '')}
        >
          {REASONS.map((r) => (
            <Option key={r} value={r}>
              {REDACTION_REASON_LABEL[r]}
            </Option>
          ))}
        </Dropdown>
      </Field>
      <Field
        label="Note for the registrar’s record (not on the roll)"
        validationMessage={fieldError(redact.error, 'note')}
      >
        <Textarea value={note} onChange={(_, d) => setNote(d.value)} resize="vertical" />
      </Field>
      <FormError error={redact.error} />
      {redact.data && (
        <MessageBar intent="success" role="status">
          <MessageBarBody>
            Entry {redact.data.seq} of lot {formatLotCode(redact.data.lot)} is removed (redaction entry{' '}
            {redact.data.redactionSeq}).
            {redact.data.blockedDigests.length > 0 &&
              ` ${redact.data.blockedDigests.length} files deleted and blocked.`}
          </MessageBarBody>
        </MessageBar>
      )}
      <div className={styles.row}>
        <Button appearance="primary" type="submit" disabled={redact.isPending}>
          Remove the contents
        </Button>
      </div>
    </Form>
  );
}

function Decision({ r }: { r: RedactionRequest }) {
  const styles = useStyles();
  const client = useQueryClient();
  const [declining, setDeclining] = useState(false);
  const [why, setWhy] = useState('');
  const done = () => client.invalidateQueries({ queryKey: ['registry'] });
  const approve = useMutation({ mutationFn: () => registryToolsApi.approveRequest(r.id), onSuccess: done });
  const decline = useMutation({
    mutationFn: () => registryToolsApi.declineRequest(r.id, why),
    onSuccess: done,
  });
  return (
    <>
      <div className={styles.row}>
        <Button
          size="small"
          appearance="primary"
          onClick={() => approve.mutate()}
          disabled={approve.isPending}
        >
          Remove it
        </Button>
        {declining ? (
          <>
            <Field label="Why not" validationMessage={fieldError(decline.error, 'reason')}>
              <Input value={why} onChange={(_, d) => setWhy(d.value)} />
            </Field>
            <Button size="small" onClick={() => decline.mutate()} disabled={decline.isPending}>
              Decline
            </Button>
          </>
        ) : (
          <Button size="small" onClick={() => setDeclining(true)}>
            Decline…
          </Button>
        )}
      </div>
      <FormError error={approve.error} />
    </>
  );
}

const columns: Array<ListColumn<RedactionRequest>> = [
  { id: 'asked', header: 'Asked', cell: (r) => formatDate(r.createdAt) },
  { id: 'entry', header: 'Entry', cell: (r) => `${formatLotCode(r.lot)} · entry ${r.seq} (${r.kind})` },
  { id: 'why', header: 'Why', cell: (r) => r.note },
  { id: 'decision', header: 'Decision', cell: (r) => <Decision r={r} /> },
];

/** Redaction by the registrar, and the holders' requests waiting for a decision. */
export function RedactionsPage() {
  const requests = useQuery(redactionRequestsQuery());
  return (
    <Page title="Redaction" width="medium">
      <RedactForm />
      <div>
        <Title3 as="h2">Holders’ requests</Title3>
        {requests.data?.length === 0 && <Text>No requests are waiting.</Text>}
        {requests.data && requests.data.length > 0 && (
          <DataTable label="Holders’ requests" columns={columns} rows={requests.data} rowKey={(r) => r.id} />
        )}
      </div>
    </Page>
  );
}
