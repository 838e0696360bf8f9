import {
  Badge,
  Button,
  Card,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Text,
  Title3,
  tokens,
} from '@fluentui/react-components';
import { useMutation } from '@tanstack/react-query';
import { Navigate } from 'react-router-dom';
import { accountsApi, useSession } from './accounts.api';
import { Form, FormError, FormSuccess, PasswordField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
import { formatDate } from '../../common/ui/format';
import { ROLE_LABEL, STATUS_LABEL } from './labels';
import { Page } from '../../common/ui/Page';
import { type Fact, Facts } from '../../common/ui/Facts';

const useStyles = makeStyles({
  card: { padding: tokens.spacingHorizontalXL, display: 'grid', gap: tokens.spacingVerticalM },
  form: { display: 'grid', gap: tokens.spacingVerticalM, maxWidth: '420px' },
});

function ChangePassword() {
  const styles = useStyles();
  const form = useFormValues({ currentPassword: '', newPassword: '' });
  const change = useMutation({
    mutationFn: () => accountsApi.changePassword(form.values.currentPassword, form.values.newPassword),
    onSuccess: form.reset,
  });
  const field = form.bind(change.error);
  return (
    <Form className={styles.form} onSubmit={() => change.mutate()}>
      <PasswordField label="Current password" autoComplete="current-password" {...field('currentPassword')} />
      <PasswordField
        label="New password"
        hint="At least 12 characters. Every other sign-in ends."
        autoComplete="new-password"
        {...field('newPassword')}
      />
      <FormError error={change.error} />
      {change.isSuccess ? <FormSuccess>{change.data.message}</FormSuccess> : null}
      <Button appearance="primary" type="submit" disabled={change.isPending}>
        Change password
      </Button>
    </Form>
  );
}

export function AccountPage() {
  const styles = useStyles();
  const { account, isLoading } = useSession();
  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to="/sign-in?next=/account" replace />;
  const facts: Fact[] = [
    ['Handle', account.handle],
    ['Role', ROLE_LABEL[account.role]],
    ['Business', account.business],
    ['Town', account.town],
    ['Country', account.country],
    ['E-mail address', account.email],
    ['Verified since', formatDate(account.verifiedSince)],
  ];
  return (
    <Page title={account.displayName} width="narrow" headingId="account-title">
      <div>
        <Badge appearance="tint" color={account.status === 'verified' ? 'success' : 'warning'}>
          {STATUS_LABEL[account.status]}
        </Badge>
      </div>
      {account.status === 'pending' ? (
        <MessageBar intent="info">
          <MessageBarBody>
            The registrar has not verified your account yet. You can read; writing to rolls opens once you are
            verified, and we will tell you by e-mail.
          </MessageBarBody>
        </MessageBar>
      ) : null}
      {(account.status === 'suspended' || account.status === 'rejected') && account.statusReason ? (
        <MessageBar intent="warning">
          <MessageBarBody>The registrar’s reason: {account.statusReason}</MessageBarBody>
        </MessageBar>
      ) : null}
      <Card className={styles.card}>
        <Title3 as="h2">Your details</Title3>
        <Facts rows={facts} />
      </Card>
      <Card className={styles.card}>
        <Title3 as="h2">Password</Title3>
        <ChangePassword />
      </Card>
    </Page>
  );
}
