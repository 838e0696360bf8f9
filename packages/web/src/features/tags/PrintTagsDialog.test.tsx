import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { json, renderWithProviders } from '../../common/testing/render';
import { PrintTagsDialog } from './PrintTagsDialog';

// Fluent marks the surface aria-hidden while its opening motion runs in jsdom, hence `hidden: true`.

function layouts(barbellFits: boolean) {
  return {
    host: barbellFits ? '127.0.0.1:3000' : 'TAGS.BEAD-REGISTER.EXAMPLE',
    version: barbellFits ? 2 : 3,
    designs: [
      { design: 'string', fits: true, moduleMm: 0.56 },
      barbellFits
        ? { design: 'barbell', fits: true, moduleMm: 0.4 }
        : { design: 'barbell', fits: false, reason: 'a barbell flag 13.2 mm tall is too small' },
    ],
    defaults: { string: { widthMm: 22, heightMm: 35 }, barbell: { widthMm: 30, heightMm: 13.2 } },
    papers: { a4: { widthMm: 210, heightMm: 297 }, letter: { widthMm: 215.9, heightMm: 279.4 } },
  };
}

function renderDialog(fetchMock: ReturnType<typeof vi.fn>, lots = [{ code: '7K2QM9XAT', listed: true }]) {
  vi.stubGlobal('fetch', fetchMock);
  return renderWithProviders(<PrintTagsDialog lots={lots} />);
}

describe('print dialog', () => {
  it('warns when the public host makes the barbell flag too small', async () => {
    renderDialog(vi.fn(async () => json(200, layouts(false))));
    await userEvent.click(screen.getByRole('button', { name: 'Print tag' }));
    expect(await screen.findByText(/too small to read on a barbell flag/)).toBeInTheDocument();
  });

  it('shows no warning for a short host', async () => {
    const fetchMock = vi.fn(async () => json(200, layouts(true)));
    renderDialog(fetchMock);
    await userEvent.click(screen.getByRole('button', { name: 'Print tag' }));
    await screen.findByRole('radio', { name: /Barbell flag/, hidden: true });
    await vi.waitFor(() => expect(fetchMock).toHaveBeenCalled());
    expect(screen.queryByText(/too small to read/)).not.toBeInTheDocument();
  });

  it('shows the server’s reason beside the sheet field it names', async () => {
    const fetchMock = vi.fn(async (url: string) =>
      url.endsWith('/layouts')
        ? json(200, layouts(true))
        : json(400, {
            error: {
              code: 'validation',
              message: 'Some fields need attention',
              fields: [{ field: 'sheet.columns', reason: '9 columns of 22 mm labels need 222 mm' }],
            },
          }),
    );
    renderDialog(fetchMock);
    await userEvent.click(screen.getByRole('button', { name: 'Print tag' }));
    await userEvent.click(screen.getByRole('radio', { name: 'A4 label sheet', hidden: true }));
    await userEvent.type(screen.getByLabelText(/^Columns/), '9');
    await userEvent.click(screen.getByRole('button', { name: 'Download PDF', hidden: true }));
    expect(await screen.findByText('9 columns of 22 mm labels need 222 mm')).toBeInTheDocument();
    const body = JSON.parse(
      (fetchMock.mock.calls.at(-1) as unknown as [string, RequestInit])[1].body as string,
    );
    expect(body).toMatchObject({ lots: ['7K2QM9XAT'], design: 'string', sheet: { paper: 'a4', columns: 9 } });
  });

  it('offers to list unlisted lots, and lists only when ticked', async () => {
    renderDialog(
      vi.fn(async () => json(200, layouts(true))),
      [{ code: '7K2QM9XAT', listed: false }],
    );
    await userEvent.click(screen.getByRole('button', { name: 'Print tag' }));
    expect(screen.getByRole('checkbox', { name: /List this lot/, hidden: true })).not.toBeChecked();
  });
});
