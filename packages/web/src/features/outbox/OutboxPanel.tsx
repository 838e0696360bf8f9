import {
  Button,
  MessageBar,
  MessageBarActions,
  MessageBarBody,
  MessageBarTitle,
} from '@fluentui/react-components';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useSyncExternalStore } from 'react';
import {
  dismissQueuedWrite,
  flushOutbox,
  onQueuedWriteSent,
  outboxSnapshot,
  readOutbox,
  startOutbox,
  TOO_OLD_TO_RESEND,
  watchOutbox,
  type OutboxView,
} from '../../lib/outbox';

/** The writes kept on this phone: waiting for a signal, or refused by the server. */
export function useOutbox(): OutboxView {
  const view = useSyncExternalStore(watchOutbox, outboxSnapshot, outboxSnapshot);
  useEffect(() => {
    startOutbox();
    void readOutbox().catch(() => undefined);
  }, []);
  return view;
}

/**
 * What is waiting to be sent ("Waiting to send: 2 — sale of 7K2Q-M9XA-T, …") and what the
 * server refused, with its reason. When a waiting write is sent, the page's data is asked
 * for again, so a sold lot shows as sold.
 */
export function OutboxPanel() {
  const { mine: list, others } = useOutbox();
  const client = useQueryClient();
  useEffect(() => onQueuedWriteSent(() => void client.invalidateQueries()), [client]);
  const waiting = list.filter((w) => !w.refused);
  const refused = list.filter((w) => w.refused);
  if (list.length === 0 && others === 0) return null;
  return (
    <div aria-label="Writes kept on this device" role="region">
      {others > 0 && (
        <MessageBar intent="info" layout="multiline">
          <MessageBarBody>
            {others === 1 ? 'One write' : `${others} writes`} made on this device by another account{' '}
            {others === 1 ? 'waits' : 'wait'} until that account signs in here again.
          </MessageBarBody>
        </MessageBar>
      )}
      {waiting.length > 0 && (
        <MessageBar intent="info" layout="multiline">
          <MessageBarBody>
            <MessageBarTitle>
              Waiting to send: {waiting.length} — {waiting.map((w) => w.label).join(', ')}
            </MessageBarTitle>
            Kept on this device and sent, in this order, as soon as there is a signal.
          </MessageBarBody>
          <MessageBarActions>
            <Button onClick={() => void flushOutbox().catch(() => undefined)}>Send now</Button>
          </MessageBarActions>
        </MessageBar>
      )}
      {refused.map((w) => (
        <MessageBar key={w.key} intent="error" layout="multiline">
          <MessageBarBody>
            {w.refused === TOO_OLD_TO_RESEND ? (
              <>
                <MessageBarTitle>Perhaps not recorded: {w.label}</MessageBarTitle>
                {w.refused}
              </>
            ) : (
              <>
                <MessageBarTitle>Not recorded: {w.label}</MessageBarTitle>
                The server refused it: {w.refused}
              </>
            )}
          </MessageBarBody>
          <MessageBarActions>
            <Button onClick={() => void dismissQueuedWrite(w.key)}>Dismiss</Button>
          </MessageBarActions>
        </MessageBar>
      ))}
    </div>
  );
}
