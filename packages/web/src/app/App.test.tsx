import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderAt } from '../common/testing/render';

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
