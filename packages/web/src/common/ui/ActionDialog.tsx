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
import { Form } from './FormPage';

const useStyles = makeStyles({
  surface: { maxWidth: 'min(880px, 100vw - 16px)', width: '100%' },
  narrow: { maxWidth: 'min(560px, 100vw - 16px)' },
  wide: { maxWidth: 'min(1100px, 96vw)' },
  content: { display: 'grid', gap: tokens.spacingVerticalM, maxHeight: '70vh', overflowY: 'auto' },
});

/**
 * The frame of a lot-page action: a modal form with a title, Cancel and one submit button.
 * Once `done`, only a Close button is left (the content then says what happened).
 */
export function ActionDialog({
  title,
  close,
  onSubmit,
  submitLabel,
  pending,
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
  done?: boolean;
  narrow?: boolean;
  submitDisabled?: boolean;
  /** The id of the text that explains the dialog, for screen readers. */
  describedBy?: string;
  children: ReactNode;
}) {
  const styles = useStyles();
  return (
    <Dialog open onOpenChange={(_, d) => !d.open && close()}>
      <DialogSurface
        className={mergeClasses(styles.surface, narrow && styles.narrow)}
        aria-describedby={describedBy}
      >
        <Form onSubmit={onSubmit}>
          <DialogBody>
            <DialogTitle>{title}</DialogTitle>
            <DialogContent className={styles.content}>{children}</DialogContent>
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
      </DialogSurface>
    </Dialog>
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
    <Dialog open onOpenChange={(_, d) => !d.open && close()}>
      <DialogSurface
        className={mergeClasses(styles.surface, wide ? styles.wide : styles.narrow)}
        aria-describedby={undefined}
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
      </DialogSurface>
    </Dialog>
  );
}
