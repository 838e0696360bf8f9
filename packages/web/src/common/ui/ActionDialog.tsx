import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  makeStyles,
  mergeClasses,
  tokens,
} from '@fluentui/react-components';
import type { ReactNode } from 'react';
import { Form, FormError } from './FormPage';

const useStyles = makeStyles({
  surface: { maxWidth: 'min(880px, 100vw - 16px)', width: '100%' },
  narrow: { maxWidth: 'min(560px, 100vw - 16px)' },
  wide: { maxWidth: 'min(1100px, 96vw)' },
  content: { display: 'grid', gap: tokens.spacingVerticalM, maxHeight: '70vh', overflowY: 'auto' },
});

/** The modal both dialogs are: closing it (Escape, outside) calls `close`. */
function Modal({
  close,
  className,
  describedBy,
  children,
}: {
  close: () => void;
  className: string;
  describedBy: string | undefined;
  children: ReactNode;
}) {
  return (
    <Dialog open onOpenChange={(_, d) => !d.open && close()}>
      <DialogSurface className={className} aria-describedby={describedBy}>
        {children}
      </DialogSurface>
    </Dialog>
  );
}

/**
 * The frame of a lot-page action: a modal form with a title, Cancel and one submit button.
 * Once `done`, only a Close button is left (the content then says what happened). `error`, the
 * failed request, shows under the fields when it is not about one of them.
 */
export function ActionDialog({
  title,
  close,
  onSubmit,
  submitLabel,
  pending,
  error,
  done = false,
  narrow = false,
  submitDisabled = false,
  describedBy,
  children,
}: {
  title: string;
  close: () => void;
  onSubmit: () => void;
  submitLabel: string;
  pending: boolean;
  error?: unknown;
  done?: boolean;
  narrow?: boolean;
  submitDisabled?: boolean;
  /** The id of the text that explains the dialog, for screen readers. */
  describedBy?: string;
  children: ReactNode;
}) {
  const styles = useStyles();
  return (
    <Modal
      close={close}
      className={mergeClasses(styles.surface, narrow && styles.narrow)}
      describedBy={describedBy}
    >
      <Form onSubmit={onSubmit}>
        <DialogBody>
          <DialogTitle>{title}</DialogTitle>
          <DialogContent className={styles.content}>
            {children}
            {error === undefined ? null : <FormError error={error} />}
          </DialogContent>
          <DialogActions>
            <Button appearance={done ? 'primary' : 'secondary'} onClick={close}>
              {done ? 'Close' : 'Cancel'}
            </Button>
            {!done && (
              <Button appearance="primary" type="submit" disabled={pending || submitDisabled}>
                {submitLabel}
              </Button>
            )}
          </DialogActions>
        </DialogBody>
      </Form>
    </Modal>
  );
}

/**
 * A modal that shows something (a photo, an application, a form with its own buttons) with one
 * Close button. `wide` gives room to a long form or a large picture.
 */
export function PanelDialog({
  title,
  close,
  wide = false,
  children,
}: {
  title: string;
  close: () => void;
  wide?: boolean;
  children: ReactNode;
}) {
  const styles = useStyles();
  return (
    <Modal
      close={close}
      className={mergeClasses(styles.surface, wide ? styles.wide : styles.narrow)}
      describedBy={undefined}
    >
      <DialogBody>
        <DialogTitle>{title}</DialogTitle>
        <DialogContent className={styles.content}>{children}</DialogContent>
        <DialogActions>
          <Button appearance="primary" onClick={close}>
            Close
          </Button>
        </DialogActions>
      </DialogBody>
    </Modal>
  );
}
