import {
  Button,
  makeStyles,
  Menu,
  MenuItem,
  MenuList,
  MenuPopover,
  MenuTrigger,
  Text,
  tokens,
} from '@fluentui/react-components';
import { useQueryClient } from '@tanstack/react-query';
import { Link as RouterLink, useNavigate } from 'react-router-dom';
import { accountsApi, rememberSession, useSession } from './accounts.api';

const useStyles = makeStyles({
  link: {
    color: tokens.colorNeutralForegroundOnBrand,
    textDecorationLine: 'none',
    paddingInline: tokens.spacingHorizontalS,
    ':hover': { textDecorationLine: 'underline' },
  },
  offline: { color: tokens.colorNeutralForegroundOnBrand, fontWeight: tokens.fontWeightSemibold },
});

/** The shell's account area: sign-in links, or the signed-in name with its menu. */
export function AccountMenu() {
  const styles = useStyles();
  const { account, isLoading, offline } = useSession();
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
      rememberSession(null);
      client.setQueryData(['session'], null);
      await client.invalidateQueries();
      navigate('/');
    }
  };
  return (
    <>
      {offline ? (
        <Text
          className={styles.offline}
          title="The server cannot be reached: this is who was signed in here last"
        >
          No signal
        </Text>
      ) : null}
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
    </>
  );
}
