import { useMutation } from '@tanstack/react-query';
import { accountsApi } from './accounts.api';
import { RequestFormPage, TextField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';

export function ForgotPasswordPage() {
  const form = useFormValues({ email: '' });
  const forgot = useMutation({ mutationFn: () => accountsApi.forgotPassword(form.values.email) });
  return (
    <RequestFormPage
      title="Forgotten password"
      lead="We will e-mail you a link to choose a new password. It works once, for one hour."
      request={forgot}
      submitLabel="Send the link"
      doneTitle="Check your e-mail"
    >
      <TextField
        label="E-mail address"
        required
        type="email"
        autoComplete="email"
        {...form.bind(forgot.error)('email')}
      />
    </RequestFormPage>
  );
}
