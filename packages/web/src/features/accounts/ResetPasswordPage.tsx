import { useState } from 'react';
import { accountsApi } from './accounts.api';
import { EmailedLinkPage } from './EmailedLinkPage';
import { fieldError, PasswordField } from '../../common/ui/FormPage';

/** Opened from a reset or set-password link; the password changes on the POST from this page. */
export function ResetPasswordPage() {
  const [password, setPassword] = useState('');
  return (
    <EmailedLinkPage
      title="Choose a new password"
      lead="Choosing a new password signs you out everywhere."
      submitLabel="Set the password"
      doneTitle="Password set"
      send={(token) => accountsApi.resetPassword(token, password)}
      fields={(error) => (
        <PasswordField
          label="New password"
          hint="At least 12 characters."
          autoComplete="new-password"
          value={password}
          onChange={setPassword}
          validationMessage={fieldError(error, 'password')}
        />
      )}
    />
  );
}
