import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders } from '../../common/testing/render';
import { ScanScreen } from './ScanScreen';

describe('ScanScreen', () => {
  it('names its region after the heading it shows', () => {
    renderWithProviders(
      <ScanScreen title="Lot ABC-123" titleId="lot-title">
        <p>Price</p>
      </ScanScreen>,
    );
    expect(screen.getByRole('heading', { level: 1, name: 'Lot ABC-123' })).toBeInTheDocument();
    expect(screen.getByRole('region', { name: 'Lot ABC-123' })).toHaveTextContent('Price');
  });

  it('is a bare frame without a title', () => {
    renderWithProviders(
      <ScanScreen>
        <p>This is not a lot you hold.</p>
      </ScanScreen>,
    );
    expect(screen.queryByRole('heading')).toBeNull();
    expect(screen.getByText('This is not a lot you hold.')).toBeInTheDocument();
  });
});
