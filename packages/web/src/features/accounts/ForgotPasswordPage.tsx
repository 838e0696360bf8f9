import { Button, Field, Input } from '@fluentui/react-components';
import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { accountsApi } from './accounts.api';
import { fieldError, FormError, FormPage, FormSuccess } from '../../common/ui/FormPage';

export function ForgotPasswordPage() {
  const [email, setEmail] = useState('');
  const forgot = useMutation({ mutationFn: () => accountsApi.forgotPassword(email) });
  if (forgot.isSuccess) {
    return (
      <FormPage title="Check your e-mail">
        <FormSuccess>{forgot.data.message}</FormSuccess>
      </FormPage>
    );
  }
  return (
    <FormPage
      title="Forgotten password"
      lead="We will e-mail you a link to choose a new password. It works once, for one hour."
      onSubmit={() => forgot.mutate()}
    >
      <Field label="E-mail address" required validationMessage={fieldError(forgot.error, 'email')}>
        <Input type="email" autoComplete="email" value={email} onChange={(_, d) => setEmail(d.value)} />
      </Field>
      <FormError error={forgot.error} />
      <Button appearance="primary" type="submit" disabled={forgot.isPending}>
        Send the link
      </Button>
    </FormPage>
  );
}
