import { Button, Field, Input, Link, Text } from '@fluentui/react-components';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link as RouterLink, useNavigate, useSearchParams } from 'react-router-dom';
import { accountsApi } from './accounts.api';
import { fieldError, FormError, FormPage } from './FormPage';

/** Only paths inside the app are followed after signing in. */
function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/account';
}

export function SignInPage() {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const client = useQueryClient();
  const signIn = useMutation({
    mutationFn: () => accountsApi.signIn({ email, password }),
    onSuccess: ({ account }) => {
      client.setQueryData(['session'], account);
      navigate(safeNext(params.get('next')));
    },
  });
  return (
    <FormPage title="Sign in" onSubmit={() => signIn.mutate()}>
      <Field label="E-mail address" required validationMessage={fieldError(signIn.error, 'email')}>
        <Input type="email" autoComplete="email" value={email} onChange={(_, d) => setEmail(d.value)} />
      </Field>
      <Field label="Password" required validationMessage={fieldError(signIn.error, 'password')}>
        <Input
          type="password"
          autoComplete="current-password"
          value={password}
          onChange={(_, d) => setPassword(d.value)}
        />
      </Field>
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
