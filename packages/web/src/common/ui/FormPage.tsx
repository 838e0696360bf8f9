import {
  Button,
  Card,
  Field,
  Input,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Text,
  Textarea,
  Title2,
  tokens,
} from '@fluentui/react-components';
import type { UseMutationResult } from '@tanstack/react-query';
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
        <Form className={styles.form} onSubmit={onSubmit}>
          {children}
        </Form>
      ) : (
        children
      )}
    </Card>
  );
}

/**
 * A {@link FormPage} whose form sends one request: the fields, the request's failure and the submit
 * button; once the request succeeded, the page says so under `doneTitle` with the server's
 * message and whatever `after` adds (a way on). `onSubmit` defaults to sending the request.
 */
export function RequestFormPage({
  title,
  lead,
  request,
  submitLabel,
  submitDisabled = false,
  onSubmit = () => request.mutate(),
  doneTitle,
  after,
  children,
}: {
  title: string;
  lead?: ReactNode;
  request: UseMutationResult<{ message: string }, Error, void>;
  submitLabel: string;
  submitDisabled?: boolean;
  onSubmit?: () => void;
  doneTitle: string;
  after?: ReactNode;
  children?: ReactNode;
}) {
  if (request.isSuccess) {
    return (
      <FormPage title={doneTitle}>
        <FormSuccess>{request.data.message}</FormSuccess>
        {after}
      </FormPage>
    );
  }
  return (
    <FormPage title={title} lead={lead} onSubmit={onSubmit}>
      {children}
      <FormError error={request.error} />
      <Button appearance="primary" type="submit" disabled={submitDisabled || request.isPending}>
        {submitLabel}
      </Button>
    </FormPage>
  );
}

/**
 * A form checked by our own code and the server, not the browser's bubbles (`noValidate`); a
 * submit calls `onSubmit` and never reloads the page.
 */
export function Form({
  className,
  onSubmit,
  children,
}: {
  className?: string;
  onSubmit: () => void;
  children: ReactNode;
}) {
  return (
    <form
      className={className}
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        onSubmit();
      }}
    >
      {children}
    </form>
  );
}

/** A password in its labelled field; `autoComplete` tells a password manager which one it is. */
export function PasswordField({
  label,
  value,
  onChange,
  autoComplete,
  validationMessage,
  hint,
}: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  autoComplete: 'current-password' | 'new-password';
  validationMessage?: string;
  hint?: string;
}) {
  return (
    <Field label={label} required hint={hint} validationMessage={validationMessage}>
      <Input
        type="password"
        autoComplete={autoComplete}
        value={value}
        onChange={(_, d) => onChange(d.value)}
      />
    </Field>
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

/** The server's message for a failed request that names no field (those show beside their field). */
export function UnfieldedError({ error }: { error: ApiError | null | undefined }) {
  if (!error || error.fields.length) return null;
  return (
    <MessageBar intent="error">
      <MessageBarBody>{error.message}</MessageBarBody>
    </MessageBar>
  );
}

/** A one-line text in its labelled field; `type` picks the keyboard (e-mail, date…). */
export function TextField({
  label,
  hint,
  required,
  type,
  value,
  onChange,
  validationMessage,
  placeholder,
  autoComplete,
}: {
  label: string;
  hint?: string;
  required?: boolean;
  type?: 'text' | 'email' | 'date';
  value: string;
  onChange: (v: string) => void;
  validationMessage?: string;
  placeholder?: string;
  autoComplete?: string;
}) {
  return (
    <Field label={label} hint={hint} required={required} validationMessage={validationMessage}>
      <Input
        type={type}
        autoComplete={autoComplete}
        placeholder={placeholder}
        value={value}
        onChange={(_, d) => onChange(d.value)}
      />
    </Field>
  );
}

/** A free text in a labelled box that grows downwards. */
export function NoteField({
  label,
  hint,
  required,
  value,
  onChange,
  validationMessage,
}: {
  label: string;
  hint?: string;
  required?: boolean;
  value: string;
  onChange: (v: string) => void;
  validationMessage?: string;
}) {
  return (
    <Field label={label} hint={hint} required={required} validationMessage={validationMessage}>
      <Textarea value={value} onChange={(_, d) => onChange(d.value)} resize="vertical" />
    </Field>
  );
}
