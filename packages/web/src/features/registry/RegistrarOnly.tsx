import { Text } from '@fluentui/react-components';
import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { useSession } from '../accounts/accounts.api';

/** Shows its children to a signed-in registrar only. */
export function RegistrarOnly({ children }: { children: ReactNode }) {
  const { account, isLoading } = useSession();
  const here = useLocation();
  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to={`/sign-in?next=${encodeURIComponent(here.pathname)}`} replace />;
  if (account.role !== 'registrar') return <Text>Only the registrar can see this page.</Text>;
  return <>{children}</>;
}
