import { Button, Link, Text } from '@fluentui/react-components';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { Link as RouterLink, useNavigate, useSearchParams } from 'react-router-dom';
import { accountsApi, rememberSession, type Me } from './accounts.api';
import { FormError, FormPage, PasswordField, TextField } from '../../common/ui/FormPage';
import { useFormValues } from '../../common/ui/form-values';

/**
 * Where a sign-in lands: the page asked for (only paths inside the app), else the account's
 * daily work — a dealer's inventory, the registrar's verification queue, an assessor's start
 * page (the listed lots to give opinions on) — and the account page while not yet verified.
 */
export function landingFor(account: Me, next: string | null): string {
  if (next && next.startsWith('/') && !next.startsWith('//')) return next;
  if (account.role === 'registrar') return '/registry';
  if (account.status !== 'verified') return '/account';
  return account.role === 'dealer' ? '/lots' : '/';
}

export function SignInPage() {
  const form = useFormValues({ email: '', password: '' });
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const client = useQueryClient();
  const signIn = useMutation({
    mutationFn: () => accountsApi.signIn(form.values),
    onSuccess: ({ account }) => {
      rememberSession(account);
      client.setQueryData(['session'], account);
      navigate(landingFor(account, params.get('next')));
    },
  });
  const field = form.bind(signIn.error);
  return (
    <FormPage title="Sign in" onSubmit={() => signIn.mutate()}>
      <TextField label="E-mail address" required type="email" autoComplete="email" {...field('email')} />
      <PasswordField label="Password" autoComplete="current-password" {...field('password')} />
      <FormError error={signIn.error} />
      <Button appearance="primary" type="submit" disabled={signIn.isPending}>
        Sign in
      </Button>
      <Text>
        <Link as="span">
          <RouterLink to="/forgot-password">Forgotten your password?</RouterLink>
        </Link>
        {' · '}
        <Link as="span">
          <RouterLink to="/sign-up">Apply for an account</RouterLink>
        </Link>
      </Text>
    </FormPage>
  );
}
