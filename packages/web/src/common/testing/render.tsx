import { render } from '@testing-library/react';
import { QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { vi } from 'vitest';
import { Providers, routes } from '../../app/App';
import type { Me } from '../../features/accounts/accounts.api';

/** A fresh query client for one test: no retries, so a failed request shows at once. */
export function testClient(): QueryClient {
  return new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
}

/** A JSON answer as the server sends it. */
export function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

/** The server's answer to anything a test does not serve. */
export const notFound = () => json(404, { error: { code: 'not_found', message: 'Not found.' } });

/** Renders a part of the app inside the app's providers. */
export function renderWithProviders(ui: ReactNode) {
  return render(<Providers client={testClient()}>{ui}</Providers>);
}

/** Renders the whole app at `path`; the router is returned to read the address. */
export function renderAt(path: string) {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  render(
    <Providers client={testClient()}>
      <RouterProvider router={router} />
    </Providers>,
  );
  return router;
}

export interface SentRequest {
  url: string;
  method: string;
  /** A JSON body read back; any other body as it was sent. */
  body?: unknown;
}

function readBody(body: RequestInit['body']): unknown {
  if (typeof body !== 'string') return body ?? undefined;
  try {
    return JSON.parse(body);
  } catch {
    return body;
  }
}

/**
 * Stands in for the server: the session answer for `account`, then `handler`, then 404. Returns
 * the requests the page sent, in order.
 */
export function stubServer(
  account: Me | null,
  handler: (url: string, init?: RequestInit) => Response | undefined = () => undefined,
): SentRequest[] {
  const calls: SentRequest[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init?: RequestInit) => {
      calls.push({ url, method: init?.method ?? 'GET', body: readBody(init?.body) });
      if (url === '/api/auth/session') return json(200, { account });
      return handler(url, init) ?? notFound();
    }),
  );
  return calls;
}

const VERIFIED = {
  status: 'verified',
  emailVerified: true,
  verifiedSince: '2025-03-01T09:00:00Z',
  statusReason: null,
  createdAt: '2025-03-01T09:00:00Z',
} as const;

/** Invented accounts for tests. */
export const accounts = {
  registrar: {
    ...VERIFIED,
    id: '6f1c1f7e-8a55-4b43-9a43-000000000001',
    role: 'registrar',
    handle: 'registry-desk',
    displayName: 'Juno Pellarin',
    email: 'juno@example.invalid',
    business: 'Registry',
    town: 'Rocaille Ford',
    country: 'Marver Isles',
  },
  dealer: {
    ...VERIFIED,
    id: '6f1c1f7e-8a55-4b43-9a43-0000000000b2',
    role: 'dealer',
    handle: 'oskar-wendle',
    displayName: 'Oskar Wendle',
    email: 'oskar@example.invalid',
    business: 'Wendle Bead Barrow',
    town: 'Murrine Vale',
    country: 'Marver Isles',
  },
} satisfies Record<string, Me>;
