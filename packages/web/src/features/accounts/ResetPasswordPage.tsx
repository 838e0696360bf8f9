import { accountsApi } from './accounts.api';
import { EmailedLinkPage } from './EmailedLinkPage';
import { PasswordField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';

/** Opened from a reset or set-password link; the password changes on the POST from this page. */
export function ResetPasswordPage() {
  const form = useFormValues({ password: '' });
  return (
    <EmailedLinkPage
      title="Choose a new password"
      lead="Choosing a new password signs you out everywhere."
      submitLabel="Set the password"
      doneTitle="Password set"
      send={(token) => accountsApi.resetPassword(token, form.values.password)}
      fields={(error) => (
        <PasswordField
          label="New password"
          hint="At least 12 characters."
          autoComplete="new-password"
          {...form.bind(error)('password')}
        />
      )}
    />
  );
}
