import {
  Button,
  makeStyles,
  MessageBar,
  MessageBarBody,
  ProgressBar,
  Field,
  Text,
  tokens,
} from '@fluentui/react-components';
import { formatLotCode } from '@beadroll/core';
import { useRef, useState } from 'react';
import { DataTable, type ListColumn } from '../../common/ui/list/DataTable';
import { runAudit, type AuditEvent } from './registry.api';
import { Page } from '../../common/ui/Page';

const useStyles = makeStyles({
  sub: { color: tokens.colorNeutralForeground3 },
});

type Broken = Extract<AuditEvent, { type: 'broken' }>;
type Done = Extract<AuditEvent, { type: 'done' }>;

const columns: Array<ListColumn<Broken>> = [
  { id: 'lot', header: 'Lot', cell: (b) => formatLotCode(b.lot) },
  { id: 'seq', header: 'First bad entry', cell: (b) => b.seq },
  { id: 'reason', header: 'Reason', cell: (b) => b.reason },
  { id: 'message', header: 'Detail', cell: (b) => b.message },
];

/** The full-ledger audit as a page: progress while every roll is verified, then the broken ones. */
export function AuditPage() {
  const styles = useStyles();
  const [running, setRunning] = useState(false);
  const [progress, setProgress] = useState<{
    lotsChecked: number;
    lots: number;
    entriesChecked: number;
  } | null>(null);
  const [broken, setBroken] = useState<Broken[]>([]);
  const [done, setDone] = useState<Done | null>(null);
  const [error, setError] = useState<string | null>(null);
  const abort = useRef<AbortController | null>(null);

  const start = async () => {
    abort.current = new AbortController();
    setRunning(true);
    setBroken([]);
    setDone(null);
    setError(null);
    setProgress(null);
    try {
      await runAudit((e) => {
        if (e.type === 'start') setProgress({ lotsChecked: 0, lots: e.lots, entriesChecked: 0 });
        else if (e.type === 'progress') setProgress(e);
        else if (e.type === 'broken') setBroken((b) => [...b, e]);
        else setDone(e);
      }, abort.current.signal);
    } catch (e) {
      if ((e as Error).name !== 'AbortError') setError((e as Error).message);
    } finally {
      setRunning(false);
    }
  };

  const share =
    progress && progress.lots > 0 ? progress.lotsChecked / progress.lots : running ? undefined : 0;
  return (
    <Page title="Full-ledger audit" width="medium">
      <Text className={styles.sub}>
        Verifies every roll in the database from its first entry: hashes, links between entries, the rules of
        each entry, parent links of split and combined lots. Then it compares every copy the database keeps
        beside a roll with what the roll says: each entry’s time, author and number, the lot’s stored head and
        state, its row in the lot lists, and sealed values. A lot whose copies differ is listed with the
        reason “stored-copy” and each value that differs.
      </Text>
      <div>
        {running ? (
          <Button onClick={() => abort.current?.abort()}>Stop</Button>
        ) : (
          <Button appearance="primary" onClick={() => void start()}>
            {done ? 'Run the audit again' : 'Run the audit'}
          </Button>
        )}
      </div>
      {(running || progress) && (
        <Field
          label="Progress"
          validationState="none"
          validationMessage={
            progress
              ? `${progress.lotsChecked} of ${progress.lots} lots checked, ${progress.entriesChecked} entries`
              : 'Starting…'
          }
        >
          <ProgressBar value={share} max={1} aria-label="Lots checked" />
        </Field>
      )}
      {error && (
        <MessageBar intent="error">
          <MessageBarBody>{error}</MessageBarBody>
        </MessageBar>
      )}
      {done && (
        <MessageBar intent={done.ok ? 'success' : 'error'} role="status">
          <MessageBarBody>
            {done.ok
              ? `Every roll is intact: ${done.lotsChecked} lots, ${done.entriesChecked} entries.`
              : `${done.broken} of ${done.lotsChecked} rolls are broken.`}
          </MessageBarBody>
        </MessageBar>
      )}
      {broken.length > 0 && (
        <DataTable label="Broken rolls" columns={columns} rows={broken} rowKey={(b) => b.lot} />
      )}
    </Page>
  );
}
