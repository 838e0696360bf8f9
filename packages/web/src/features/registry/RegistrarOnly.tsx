import { Text } from '@fluentui/react-components';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { useSession } from '../accounts/accounts.api';

/** The registrar's pages, as a layout route: its child routes show to a signed-in registrar only. */
export function RegistrarOnly() {
  const { account, isLoading } = useSession();
  const here = useLocation();
  if (isLoading) return <Text>Loading…</Text>;
  if (!account) return <Navigate to={`/sign-in?next=${encodeURIComponent(here.pathname)}`} replace />;
  if (account.role !== 'registrar') return <Text>Only the registrar can see this page.</Text>;
  return <Outlet />;
}
