import { render, screen } from '@testing-library/react';
import { QueryClient } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { Providers } from './App';
import { currentNavItem, Shell, type NavItem } from './Shell';

const NAV: NavItem[] = [
  { to: '/', label: 'Start' },
  { to: '/registry', label: 'Queue' },
  { to: '/lots', label: 'Inventory' },
  { to: '/lots/new', label: 'Register a lot' },
  { to: '/registry/reports', label: 'Reports' },
];

describe('the navigation', () => {
  it('picks the one item whose path is the page’s own or the longest it lies under', () => {
    const label = (path: string) => currentNavItem(NAV, path)?.label;
    expect(label('/')).toBe('Start');
    expect(label('/lots')).toBe('Inventory');
    expect(label('/lots/new')).toBe('Register a lot');
    expect(label('/lots/ABCDE1234')).toBe('Inventory');
    expect(label('/registry/reports')).toBe('Reports');
    expect(label('/registry')).toBe('Queue');
    // A shared beginning of a name is not a folder.
    expect(label('/lotsfoo')).toBeUndefined();
    expect(label('/account')).toBeUndefined();
  });

  it('marks a single link as the current page', async () => {
    const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    const router = createMemoryRouter([{ path: '*', element: <Shell nav={NAV} /> }], {
      initialEntries: ['/lots/new'],
    });
    render(
      <Providers client={client}>
        <RouterProvider router={router} />
      </Providers>,
    );
    const main = await screen.findByRole('navigation', { name: 'Main' });
    const current = [...main.querySelectorAll('a[aria-current="page"]')].map((a) => a.textContent);
    expect(current).toEqual(['Register a lot']);
  });
});
