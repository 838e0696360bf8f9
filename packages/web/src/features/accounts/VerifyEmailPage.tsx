import { Button, Link } from '@fluentui/react-components';
import { useMutation } from '@tanstack/react-query';
import { Link as RouterLink, useSearchParams } from 'react-router-dom';
import { accountsApi } from './accounts.api';
import { FormError, FormPage, FormSuccess } from '../../shared/ui/FormPage';

/** Opened from the e-mailed link; nothing changes until the button is pressed (link scanners only GET). */
export function VerifyEmailPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const verify = useMutation({ mutationFn: () => accountsApi.verifyEmail(token) });
  if (verify.isSuccess) {
    return (
      <FormPage title="E-mail address confirmed">
        <FormSuccess>{verify.data.message}</FormSuccess>
        <Link as="span">
          <RouterLink to="/sign-in">Sign in</RouterLink>
        </Link>
      </FormPage>
    );
  }
  return (
    <FormPage
      title="Confirm your e-mail address"
      lead="Press the button to confirm that this address is yours."
      onSubmit={() => verify.mutate()}
    >
      <FormError error={verify.error} />
      <Button appearance="primary" type="submit" disabled={!token || verify.isPending}>
        Confirm my e-mail address
      </Button>
    </FormPage>
  );
}
