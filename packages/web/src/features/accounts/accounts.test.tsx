import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClient } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { Providers, routes } from '../../app/App';
import type { Me } from './accounts.api';

// jsdom has no ResizeObserver; Fluent's message bar only needs it to exist.
beforeEach(() =>
  vi.stubGlobal(
    'ResizeObserver',
    class {
      observe() {}
      unobserve() {}
      disconnect() {}
    },
  ),
);
afterEach(() => vi.unstubAllGlobals());

const registrar: Me = {
  id: '6f1c1f7e-8a55-4b43-9a43-000000000001',
  role: 'registrar',
  status: 'verified',
  handle: 'registry-desk',
  displayName: 'Juno Pellarin',
  email: 'juno@example.invalid',
  business: 'Registry',
  town: 'Rocaille Ford',
  country: 'Marver Isles',
  emailVerified: true,
  verifiedSince: '2025-03-01T09:00:00Z',
  statusReason: null,
  createdAt: '2025-03-01T09:00:00Z',
};

function json(status: number, body: unknown) {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

/** A fake server: the session answer, and a 400 for sign-up naming the password field. */
function stubServer(account: Me | null) {
  const calls: Array<{ url: string; method: string; body?: string }> = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init?: RequestInit) => {
      calls.push({ url, method: init?.method ?? 'GET', body: init?.body as string | undefined });
      if (url === '/api/auth/session') return json(200, { account });
      if (url === '/api/auth/session/refresh')
        return json(401, { error: { code: 'session_invalid', message: 'x' } });
      if (url === '/api/auth/sign-up')
        return json(400, {
          error: {
            code: 'validation',
            message: 'Some fields need attention',
            fields: [{ field: 'password', reason: 'must be 12 to 128 characters long' }],
          },
        });
      if (url.startsWith('/api/registry/accounts'))
        return json(200, { items: [], total: 0, page: 1, pageSize: 20 });
      return json(404, { error: { code: 'not_found', message: 'Not found.' } });
    }),
  );
  return calls;
}

function renderAt(path: string) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  return render(
    <Providers client={client}>
      <RouterProvider router={router} />
    </Providers>,
  );
}

describe('accounts in the web app', () => {
  it('shows the server’s reason beside the field it names', async () => {
    const calls = stubServer(null);
    renderAt('/sign-up');
    await userEvent.type(screen.getByRole('textbox', { name: /handle/i }), 'Mira-Beads');
    expect(screen.getByRole('textbox', { name: /handle/i })).toHaveValue('mira-beads');
    await userEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(await screen.findByText('must be 12 to 128 characters long')).toBeInTheDocument();
    const sent = calls.find((c) => c.url === '/api/auth/sign-up')!;
    expect(sent.method).toBe('POST');
    expect(JSON.parse(sent.body!)).toMatchObject({ role: 'dealer', handle: 'mira-beads' });
  });

  it('offers sign-in to visitors and hides the registrar’s queue from them', async () => {
    stubServer(null);
    renderAt('/');
    expect(await screen.findByRole('link', { name: 'Sign in' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Verification queue' })).not.toBeInTheDocument();
  });

  it('shows the registrar the queue in the navigation and the account menu', async () => {
    stubServer(registrar);
    renderAt('/registry');
    expect(await screen.findByRole('link', { name: 'Verification queue' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: /account menu of juno pellarin/i })).toBeInTheDocument();
    expect(await screen.findByRole('heading', { name: 'Account verification' })).toBeInTheDocument();
    expect(await screen.findByText('No accounts here.')).toBeInTheDocument();
  });
});
