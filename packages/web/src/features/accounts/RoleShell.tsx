import { Shell, type NavItem } from '../../app/Shell';
import { useSession } from './accounts.api';
import { AccountMenu } from './AccountMenu';

/** Navigation items this account may use: by sign-in, role and (for writing) verified status. */
export function visibleNav(nav: NavItem[], account: ReturnType<typeof useSession>['account']): NavItem[] {
  return nav.filter((item) => {
    if (!item.roles && !item.signedIn && !item.writer) return true;
    if (!account) return false;
    if (item.roles && !item.roles.includes(account.role)) return false;
    if (item.writer && account.status !== 'verified') return false;
    return true;
  });
}

/** The shell with navigation for the signed-in role and the account menu. */
export function RoleShell({ nav }: { nav: NavItem[] }) {
  const { account } = useSession();
  return <Shell nav={visibleNav(nav, account)} account={<AccountMenu />} />;
}
