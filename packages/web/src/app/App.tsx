import { ImportLotsPage } from '../features/lot-imports/ImportLotsPage';
import { FluentProvider } from '@fluentui/react-components';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { AccountPage } from '../features/accounts/AccountPage';
import { ForgotPasswordPage } from '../features/accounts/ForgotPasswordPage';
import { RegistryPage } from '../features/accounts/RegistryPage';
import { ResetPasswordPage } from '../features/accounts/ResetPasswordPage';
import { RoleShell } from '../features/accounts/RoleShell';
import { SignInPage } from '../features/accounts/SignInPage';
import { SignUpPage } from '../features/accounts/SignUpPage';
import { VerifyEmailPage } from '../features/accounts/VerifyEmailPage';
import { HomePage } from '../features/home/HomePage';
import { InventoryPage } from '../features/lots/InventoryPage';
import { LotPage } from '../features/lots/LotPage';
import { RegisterLotPage } from '../features/lots/RegisterLotPage';
import { NotFoundPage } from '../features/not-found/NotFoundPage';
import { OfferPage } from '../features/transfers/OfferPage';
import { OffersPage } from '../features/transfers/OffersPage';
import { SalesPage } from '../features/transfers/SalesPage';
import { WaitingOffersCount } from '../features/transfers/WaitingOffersCount';
import { AuditPage } from '../features/registry/AuditPage';
import { MyDataPage } from '../features/registry/MyDataPage';
import { RecordPage } from '../features/registry/RecordPage';
import { RedactionsPage } from '../features/registry/RedactionsPage';
import { RegistrarOnly } from '../features/registry/RegistrarOnly';
import { ReportsPage } from '../features/registry/ReportsPage';
import { WitnessesPage } from '../features/transparency/WitnessesPage';
import { createQueryClient } from '../lib/query-client';
import type { NavItem } from './Shell';
import { beadrollTheme } from './theme';

const NAV: NavItem[] = [
  { to: '/', label: 'Start' },
  { to: '/registry', label: 'Verification queue', roles: ['registrar'] },
  { to: '/lots', label: 'Inventory', roles: ['dealer'] },
  { to: '/lots/new', label: 'Register a lot', roles: ['dealer'], writer: true },
  { to: '/lots/import', label: 'Import lots', roles: ['dealer'], writer: true },
  { to: '/transfers/incoming', label: 'Incoming', roles: ['dealer'], After: WaitingOffersCount },
  { to: '/transfers/outgoing', label: 'Outgoing', roles: ['dealer'] },
  { to: '/transfers/sales', label: 'Sales', roles: ['dealer'] },
  { to: '/stock', label: 'Figures', roles: ['dealer'] },
  { to: '/registry/reports', label: 'Reports', roles: ['registrar'] },
  { to: '/registry/redactions', label: 'Redaction', roles: ['registrar'] },
  { to: '/registry/record', label: 'Record', roles: ['registrar'] },
  { to: '/registry/audit', label: 'Audit', roles: ['registrar'] },
  { to: '/registry/witnesses', label: 'Witnesses', roles: ['registrar'] },
  { to: '/account/data', label: 'Your data', signedIn: true },
  { to: '/scan', label: 'Scan a tag', roles: ['dealer'] },
  { to: '/tags', label: 'Print tags', roles: ['dealer'] },
];

export const routes: RouteObject[] = [
  {
    element: <RoleShell nav={NAV} />,
    children: [
      { index: true, element: <HomePage /> },
      { path: 'sign-in', element: <SignInPage /> },
      { path: 'sign-up', element: <SignUpPage /> },
      { path: 'verify-email', element: <VerifyEmailPage /> },
      { path: 'forgot-password', element: <ForgotPasswordPage /> },
      { path: 'reset-password', element: <ResetPasswordPage /> },
      { path: 'account', element: <AccountPage /> },
      { path: 'lots', element: <InventoryPage /> },
      { path: 'lots/new', element: <RegisterLotPage /> },
      { path: 'lots/import', element: <ImportLotsPage /> },
      { path: 'lots/:code', element: <LotPage /> },
      { path: 'transfers/incoming', element: <OffersPage box="incoming" key="incoming" /> },
      { path: 'transfers/outgoing', element: <OffersPage box="outgoing" key="outgoing" /> },
      { path: 'transfers/offers/:id', element: <OfferPage /> },
      { path: 'transfers/sales', element: <SalesPage /> },
      {
        element: <RegistrarOnly />,
        children: [
          { path: 'registry', element: <RegistryPage /> },
          { path: 'registry/reports', element: <ReportsPage /> },
          { path: 'registry/redactions', element: <RedactionsPage /> },
          { path: 'registry/record', element: <RecordPage /> },
          { path: 'registry/audit', element: <AuditPage /> },
          { path: 'registry/witnesses', element: <WitnessesPage /> },
        ],
      },
      { path: 'account/data', element: <MyDataPage /> },
      // The scanner and the tag pages load on first use: they carry the QR decoder.
      {
        path: 'scan',
        lazy: async () => ({ Component: (await import('../features/scanner/ScannerPage')).ScannerPage }),
      },
      {
        path: 'scan/lots/:code',
        lazy: async () => ({
          Component: (await import('../features/scanner/ScannedLotPage')).ScannedLotPage,
        }),
      },
      // The figures page carries the chart library: the dealer app loads it on first use.
      {
        path: 'stock',
        lazy: async () => ({ Component: (await import('../features/stock/StockPage')).StockPage }),
      },
      {
        path: 'tags',
        lazy: async () => ({ Component: (await import('../features/tags/PrintTagsPage')).PrintTagsPage }),
      },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
];

/** Providers shared by the app and its tests: theme and server state. */
export function Providers({ client, children }: { client: QueryClient; children: React.ReactNode }) {
  return (
    <FluentProvider theme={beadrollTheme}>
      <QueryClientProvider client={client}>{children}</QueryClientProvider>
    </FluentProvider>
  );
}

export function App() {
  const [client] = useState(createQueryClient);
  const [router] = useState(() => createBrowserRouter(routes));
  return (
    <Providers client={client}>
      <RouterProvider router={router} />
    </Providers>
  );
}
