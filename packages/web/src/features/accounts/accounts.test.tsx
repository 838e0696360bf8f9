import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { accounts, json, renderAt, stubServer } from '../../common/testing/render';
import type { Me } from './accounts.api';

const registrar = accounts.registrar;

/** A fake server: the session answer, and a 400 for sign-up naming the password field. */
function serve(account: Me | null) {
  return stubServer(account, (url) => {
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
    return undefined;
  });
}

describe('accounts in the web app', () => {
  it('shows the server’s reason beside the field it names', async () => {
    const calls = serve(null);
    renderAt('/sign-up');
    await userEvent.type(screen.getByRole('textbox', { name: /handle/i }), 'Mira-Beads');
    expect(screen.getByRole('textbox', { name: /handle/i })).toHaveValue('mira-beads');
    await userEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(await screen.findByText('must be 12 to 128 characters long')).toBeInTheDocument();
    const sent = calls.find((c) => c.url === '/api/auth/sign-up')!;
    expect(sent.method).toBe('POST');
    expect(sent.body).toMatchObject({ role: 'dealer', handle: 'mira-beads' });
  });

  it('offers sign-in to visitors and hides the registrar’s queue from them', async () => {
    serve(null);
    renderAt('/');
    expect(await screen.findByRole('link', { name: 'Sign in' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Verification queue' })).not.toBeInTheDocument();
  });

  it('shows the registrar the queue in the navigation and the account menu', async () => {
    serve(registrar);
    renderAt('/registry');
    expect(await screen.findByRole('link', { name: 'Verification queue' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: /account menu of juno pellarin/i })).toBeInTheDocument();
    expect(await screen.findByRole('heading', { name: 'Account verification' })).toBeInTheDocument();
    expect(await screen.findByText('No accounts here.')).toBeInTheDocument();
  });
});
