import { accountsApi } from './accounts.api';
import { EmailedLinkPage } from './EmailedLinkPage';

/** Opened from the e-mailed link that confirms an account's address. */
export function VerifyEmailPage() {
  return (
    <EmailedLinkPage
      title="Confirm your e-mail address"
      lead="Press the button to confirm that this address is yours."
      submitLabel="Confirm my e-mail address"
      doneTitle="E-mail address confirmed"
      send={(token) => accountsApi.verifyEmail(token)}
    />
  );
}
