import { FluentProvider } from '@fluentui/react-components';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { HomePage } from '../features/home/HomePage';
import { NotFoundPage } from '../features/not-found/NotFoundPage';
import { ScannerPage } from '../features/scanner/ScannerPage';
import { createQueryClient } from '../lib/query-client';
import { Shell, type NavItem } from './Shell';
import { beadrollTheme } from './theme';

const NAV: NavItem[] = [
  { to: '/', label: 'Start' },
  { to: '/scan', label: 'Scan a tag' },
];

export const routes: RouteObject[] = [
  {
    element: <Shell nav={NAV} />,
    children: [
      { index: true, element: <HomePage /> },
      { path: 'scan', element: <ScannerPage /> },
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
