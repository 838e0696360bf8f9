import {
  makeStyles,
  Menu,
  MenuButton,
  MenuItem,
  MenuList,
  MenuPopover,
  MenuTrigger,
  mergeClasses,
  Text,
  tokens,
} from '@fluentui/react-components';
import type { ComponentType, ReactNode } from 'react';
import { Link, Outlet, useLocation, useNavigate } from 'react-router-dom';

/** Below this width the navigation folds into one menu button. */
const PHONE = '@media (max-width: 700px)';

const useStyles = makeStyles({
  root: {
    minHeight: '100vh',
    display: 'flex',
    flexDirection: 'column',
    backgroundColor: tokens.colorNeutralBackground2,
  },
  header: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalS,
    paddingBlock: tokens.spacingVerticalM,
    paddingInline: tokens.spacingHorizontalXL,
    backgroundColor: tokens.colorBrandBackground,
    color: tokens.colorNeutralForegroundOnBrand,
  },
  brand: {
    color: tokens.colorNeutralForegroundOnBrand,
    textDecorationLine: 'none',
    fontWeight: tokens.fontWeightBold,
    fontSize: tokens.fontSizeBase500,
  },
  nav: {
    display: 'flex',
    flexWrap: 'wrap',
    gap: tokens.spacingHorizontalM,
    flexGrow: 1,
    [PHONE]: { display: 'none' },
  },
  compact: { display: 'none', flexGrow: 1, [PHONE]: { display: 'flex' } },
  currentItem: { fontWeight: tokens.fontWeightSemibold },
  link: {
    color: tokens.colorNeutralForegroundOnBrand,
    textDecorationLine: 'none',
    paddingBlock: tokens.spacingVerticalXS,
    borderBottom: `${tokens.strokeWidthThick} solid transparent`,
    ':hover': { borderBottomColor: tokens.colorNeutralForegroundOnBrand },
  },
  active: { borderBottomColor: tokens.colorNeutralForegroundOnBrand },
  account: { display: 'flex', alignItems: 'center', gap: tokens.spacingHorizontalS },
  main: {
    flexGrow: 1,
    width: '100%',
    maxWidth: '1200px',
    boxSizing: 'border-box',
    marginInline: 'auto',
    paddingBlock: tokens.spacingVerticalXL,
    paddingInline: tokens.spacingHorizontalL,
  },
  footer: {
    paddingBlock: tokens.spacingVerticalM,
    paddingInline: tokens.spacingHorizontalXL,
    color: tokens.colorNeutralForeground3,
  },
});

export interface NavItem {
  to: string;
  label: string;
  /** Shown only to signed-in accounts with one of these roles. */
  roles?: Array<'dealer' | 'assessor' | 'registrar'>;
  /** Shown only to signed-in accounts. */
  signedIn?: boolean;
  /** Shown only to accounts the registrar has verified (they may write to rolls). */
  writer?: boolean;
  /** Shown after the label, such as a count of things waiting. */
  After?: ComponentType;
}

/**
 * The navigation item of the page at `pathname`: the one whose path is the page's own or the
 * longest one it lies under, so `/lots/new` is "Register a lot", not also "Inventory".
 */
export function currentNavItem(nav: NavItem[], pathname: string): NavItem | undefined {
  let best: NavItem | undefined;
  for (const item of nav) {
    const under =
      item.to === '/' ? pathname === '/' : pathname === item.to || pathname.startsWith(`${item.to}/`);
    if (under && (!best || item.to.length > best.to.length)) best = item;
  }
  return best;
}

/** The navigation folded into one menu, for phone screens. */
function CompactNav({ nav, current }: { nav: NavItem[]; current: NavItem | undefined }) {
  const styles = useStyles();
  const navigate = useNavigate();
  return (
    <nav aria-label="Main menu" className={styles.compact}>
      <Menu>
        <MenuTrigger disableButtonEnhancement>
          <MenuButton appearance="primary">Menu</MenuButton>
        </MenuTrigger>
        <MenuPopover>
          <MenuList>
            {nav.map((item) => (
              <MenuItem
                key={item.to}
                aria-current={item === current ? 'page' : undefined}
                className={item === current ? styles.currentItem : undefined}
                onClick={() => navigate(item.to)}
              >
                {item.label}
                {item.After ? <item.After /> : null}
              </MenuItem>
            ))}
          </MenuList>
        </MenuPopover>
      </Menu>
    </nav>
  );
}

/** The app frame: product name, navigation, account area, page content. */
export function Shell({ nav, account }: { nav: NavItem[]; account?: ReactNode }) {
  const styles = useStyles();
  const current = currentNavItem(nav, useLocation().pathname);
  return (
    <div className={styles.root}>
      <header className={styles.header}>
        <Link to="/" className={styles.brand}>
          Beadroll
        </Link>
        <nav aria-label="Main" className={styles.nav}>
          {nav.map((item) => (
            <Link
              key={item.to}
              to={item.to}
              aria-current={item === current ? 'page' : undefined}
              className={mergeClasses(styles.link, item === current && styles.active)}
            >
              {item.label}
              {item.After ? <item.After /> : null}
            </Link>
          ))}
        </nav>
        <CompactNav nav={nav} current={current} />
        <div className={styles.account}>{account}</div>
      </header>
      <main className={styles.main}>
        <Outlet />
      </main>
      <footer className={styles.footer}>
        <Text size={200}>
          Beadroll keeps the history of bead lots. An attribution is an opinion, not an authentication.
        </Text>
      </footer>
    </div>
  );
}
