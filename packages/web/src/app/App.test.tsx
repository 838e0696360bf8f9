import { render, screen } from '@testing-library/react';
import { QueryClient } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { Providers, routes } from './App';

function renderAt(path: string) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  return render(
    <Providers client={client}>
      <RouterProvider router={router} />
    </Providers>,
  );
}

describe('app shell', () => {
  it('shows the product name and says what Beadroll is for', () => {
    renderAt('/');
    expect(screen.getByRole('link', { name: 'Beadroll' })).toBeInTheDocument();
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent(/lot/i);
    expect(screen.getByText(/antique and vintage glass beads/)).toBeInTheDocument();
  });

  it('shows a not-found page for unknown paths', () => {
    renderAt('/no/such/page');
    expect(screen.getByRole('heading', { name: 'Page not found' })).toBeInTheDocument();
  });
});
