import {
  Button,
  makeStyles,
  Menu,
  MenuItem,
  MenuList,
  MenuPopover,
  MenuTrigger,
  tokens,
} from '@fluentui/react-components';
import { useQueryClient } from '@tanstack/react-query';
import { Link as RouterLink, useNavigate } from 'react-router-dom';
import { accountsApi, useSession } from './accounts.api';

const useStyles = makeStyles({
  link: {
    color: tokens.colorNeutralForegroundOnBrand,
    textDecorationLine: 'none',
    paddingInline: tokens.spacingHorizontalS,
    ':hover': { textDecorationLine: 'underline' },
  },
});

/** The shell's account area: sign-in links, or the signed-in name with its menu. */
export function AccountMenu() {
  const styles = useStyles();
  const { account, isLoading } = useSession();
  const client = useQueryClient();
  const navigate = useNavigate();
  if (isLoading) return null;
  if (!account) {
    return (
      <>
        <RouterLink className={styles.link} to="/sign-in">
          Sign in
        </RouterLink>
        <RouterLink className={styles.link} to="/sign-up">
          Apply
        </RouterLink>
      </>
    );
  }
  const signOut = async () => {
    try {
      await accountsApi.signOut();
    } finally {
      client.setQueryData(['session'], null);
      await client.invalidateQueries();
      navigate('/');
    }
  };
  return (
    <Menu>
      <MenuTrigger disableButtonEnhancement>
        <Button appearance="primary" aria-label={`Account menu of ${account.displayName}`}>
          {account.displayName}
        </Button>
      </MenuTrigger>
      <MenuPopover>
        <MenuList>
          <MenuItem onClick={() => navigate('/account')}>Your account</MenuItem>
          <MenuItem onClick={() => void signOut()}>Sign out</MenuItem>
        </MenuList>
      </MenuPopover>
    </Menu>
  );
}
