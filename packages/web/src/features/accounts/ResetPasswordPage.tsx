import { Button, Link } from '@fluentui/react-components';
import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { Link as RouterLink, useSearchParams } from 'react-router-dom';
import { accountsApi } from './accounts.api';
import { fieldError, FormError, FormPage, FormSuccess, PasswordField } from '../../shared/ui/FormPage';

/** Opened from a reset or set-password link; the password changes on the POST from this page. */
export function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const [password, setPassword] = useState('');
  const reset = useMutation({ mutationFn: () => accountsApi.resetPassword(token, password) });
  if (reset.isSuccess) {
    return (
      <FormPage title="Password set">
        <FormSuccess>{reset.data.message}</FormSuccess>
        <Link as="span">
          <RouterLink to="/sign-in">Sign in</RouterLink>
        </Link>
      </FormPage>
    );
  }
  return (
    <FormPage
      title="Choose a new password"
      lead="Choosing a new password signs you out everywhere."
      onSubmit={() => reset.mutate()}
    >
      <PasswordField
        label="New password"
        hint="At least 12 characters."
        autoComplete="new-password"
        value={password}
        onChange={setPassword}
        validationMessage={fieldError(reset.error, 'password')}
      />
      <FormError error={reset.error} />
      <Button appearance="primary" type="submit" disabled={!token || reset.isPending}>
        Set the password
      </Button>
    </FormPage>
  );
}
