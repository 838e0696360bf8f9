import { Button, Link, MessageBar, MessageBarBody, Text, Title3 } from '@fluentui/react-components';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Navigate } from 'react-router-dom';
import { useSession } from '../accounts/accounts.api';
import { Form, FormError, PasswordField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';
import { registryToolsApi } from './registry.api';
import { Page } from '../../common/ui/Page';
import { Stack } from '../../common/ui/Stack';

/** A dealer's own data: download everything Beadroll holds about them, or close the account. */
export function MyDataPage() {
  const client = useQueryClient();
  const { account, isLoading } = useSession();
  const form = useFormValues({ password: '' });
  const [confirming, setConfirming] = useState(false);
  const close = useMutation({
    mutationFn: () => registryToolsApi.closeAccount(form.values.password),
    onSuccess: () => client.invalidateQueries({ queryKey: ['session'] }),
  });
  if (close.isSuccess) {
    return (
      <MessageBar intent="success" role="status">
        <MessageBarBody>
          Your account is closed. Thank you for keeping lots’ histories with Beadroll.
        </MessageBarBody>
      </MessageBar>
    );
  }
  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to="/sign-in?next=/account/data" replace />;
  return (
    <Page title="Your data" width="narrow">
      <Stack>
        <Title3 as="h2">Download</Title3>
        <Text>
          One JSON file with everything Beadroll holds about your account: your details, sign-ins, every entry
          you wrote on any roll, the private details only you can see, and the registrar’s decisions about
          you.
        </Text>
        <Link href="/api/account/personal-data" download>
          Download my data
        </Link>
      </Stack>
      {account.role !== 'registrar' && (
        <Stack>
          <Title3 as="h2">Close your account</Title3>
          <Text>
            Your name, business and contact details are removed and the private details you recorded for
            yourself are deleted. The entries you wrote stay on their lots’ rolls under an anonymous account
            number, so every history still checks out; public pages show them as written by a former dealer.
            Open offers lapse. This cannot be undone.
          </Text>
          {confirming ? (
            <Form onSubmit={() => close.mutate()}>
              <Stack>
                <PasswordField
                  label="Your password, to confirm"
                  autoComplete="current-password"
                  {...form.bind(close.error)('password')}
                />
                <FormError error={close.error} />
                <div>
                  <Button appearance="primary" type="submit" disabled={close.isPending}>
                    Close my account for good
                  </Button>{' '}
                  <Button onClick={() => setConfirming(false)}>Keep my account</Button>
                </div>
              </Stack>
            </Form>
          ) : (
            <div>
              <Button onClick={() => setConfirming(true)}>Close my account…</Button>
            </div>
          )}
        </Stack>
      )}
    </Page>
  );
}
