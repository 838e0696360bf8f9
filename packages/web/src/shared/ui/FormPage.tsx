import {
  Card,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Text,
  Title2,
  tokens,
} from '@fluentui/react-components';
import type { ReactNode } from 'react';
import { ApiError } from '../../lib/api';

const useStyles = makeStyles({
  card: {
    maxWidth: '480px',
    width: '100%',
    marginInline: 'auto',
    padding: tokens.spacingHorizontalXL,
    display: 'grid',
    gap: tokens.spacingVerticalM,
  },
  form: { display: 'grid', gap: tokens.spacingVerticalM },
});

/** A narrow card with a title, an optional lead text and a form. */
export function FormPage({
  title,
  lead,
  children,
  onSubmit,
}: {
  title: string;
  lead?: ReactNode;
  children: ReactNode;
  onSubmit?: () => void;
}) {
  const styles = useStyles();
  return (
    <Card className={styles.card}>
      <Title2 as="h1">{title}</Title2>
      {lead ? <Text>{lead}</Text> : null}
      {onSubmit ? (
        <form
          className={styles.form}
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            onSubmit();
          }}
        >
          {children}
        </form>
      ) : (
        children
      )}
    </Card>
  );
}

/** The error of a failed request that is not about one field (field errors show beside the field). */
export function FormError({ error }: { error: unknown }) {
  if (!error) return null;
  const message =
    error instanceof ApiError
      ? error.code === 'validation'
        ? 'Some fields need attention.'
        : error.message
      : 'Something went wrong.';
  return (
    <MessageBar intent="error">
      <MessageBarBody>{message}</MessageBarBody>
    </MessageBar>
  );
}

export function FormSuccess({ children }: { children: ReactNode }) {
  return (
    <MessageBar intent="success">
      <MessageBarBody>{children}</MessageBarBody>
    </MessageBar>
  );
}

/** The server's reason for one field, from a 400 body. */
export function fieldError(error: unknown, field: string): string | undefined {
  return error instanceof ApiError ? error.fieldMessage(field) : undefined;
}
