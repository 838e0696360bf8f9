import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { describe, expect, it, vi } from 'vitest';
import { accounts, json, renderAt, stubServer, testClient } from '../../common/testing/render';
import { ownRemovableEntries, RemovalRequestAction } from './RemovalRequestAction';
import { ReportProblem } from './ReportProblem';

const registrar = accounts.registrar;

/** The public page's report form for one lot, opened from its link. */
async function openReportForm() {
  const user = userEvent.setup();
  render(
    <QueryClientProvider client={testClient()}>
      <ReportProblem code="7K2QM9XAT" />
    </QueryClientProvider>,
  );
  await user.click(screen.getByRole('button', { name: 'Report a problem with this page' }));
  return user;
}

describe('report a problem (public page)', () => {
  it('opens from the link, checks the form before sending, and sends category, text and address', async () => {
    const calls: Array<{ url: string; body: string }> = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init?: RequestInit) => {
        calls.push({ url, body: String(init?.body) });
        return json(202, { id: 'r1', message: 'Thank you. The registrar will look at your report.' });
      }),
    );
    const user = await openReportForm();
    await user.click(screen.getByRole('button', { name: 'Send the report' }));
    expect(screen.getByText('Choose what the problem is.')).toBeInTheDocument();
    expect(screen.getByText('Say what is wrong, in a few words.')).toBeInTheDocument();
    expect(calls).toHaveLength(0);

    await user.click(screen.getByRole('radio', { name: 'Suspected counterfeit or imitation' }));
    await user.type(screen.getByLabelText('What is wrong'), 'The holes are drilled, not wound.');
    await user.type(screen.getByLabelText(/Your e-mail address/), 'buyer@example.invalid');
    await user.click(screen.getByRole('button', { name: 'Send the report' }));
    expect(await screen.findByRole('status')).toHaveTextContent('The registrar will look at your report.');
    expect(calls[0]!.url).toBe('/api/public/lots/7K2QM9XAT/reports');
    expect(JSON.parse(calls[0]!.body)).toEqual({
      category: 'counterfeit',
      text: 'The holes are drilled, not wound.',
      email: 'buyer@example.invalid',
    });
  });

  it('shows the server’s reason beside the field it names', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () =>
        json(400, {
          error: {
            code: 'validation',
            message: 'x',
            fields: [{ field: 'email', reason: 'must be an e-mail address' }],
          },
        }),
      ),
    );
    const user = await openReportForm();
    await user.click(screen.getByRole('radio', { name: 'Something else' }));
    await user.type(screen.getByLabelText('What is wrong'), 'Entry 3 names my street.');
    await user.type(screen.getByLabelText(/Your e-mail address/), 'nope');
    await user.click(screen.getByRole('button', { name: 'Send the report' }));
    expect(await screen.findByText('must be an e-mail address')).toBeInTheDocument();
    // Nothing typed is lost, and mending the field takes its old error away.
    expect(screen.getByLabelText('What is wrong')).toHaveValue('Entry 3 names my street.');
    await user.type(screen.getByLabelText(/Your e-mail address/), '@example.invalid');
    expect(screen.queryByText('must be an e-mail address')).not.toBeInTheDocument();
  });
});

describe('asking the registrar to remove an entry (lot page)', () => {
  const holder = { ...registrar, id: '6f1c1f7e-8a55-4b43-9a43-0000000000d1', role: 'dealer' as const };
  const entry = (seq: number, kind: string, actor: string, body: string | null) => ({
    seq,
    kind,
    actor,
    time: `2026-0${seq + 1}-02T10:00:00Z`,
    logIndex: null,
    header: '{}',
    body,
  });
  const roll = {
    lot: '7K2QM9XAT',
    entries: [
      entry(0, 'registered', holder.id, '{}'),
      entry(1, 'exhibit-added', holder.id, '{}'),
      entry(2, 'opinion', '6f1c1f7e-8a55-4b43-9a43-0000000000e2', '{}'),
      entry(3, 'note', holder.id, null),
    ],
  };

  it('offers only the holder’s own entries that still have a body, and sends the choice and the reason', async () => {
    expect(ownRemovableEntries(roll as never, holder.id).map((c) => c.seq)).toEqual([1]);
    const calls: Array<{ url: string; body: string }> = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init?: RequestInit) => {
        if (url.endsWith('/roll')) return json(200, roll);
        calls.push({ url, body: String(init?.body) });
        if (JSON.parse(String(init?.body)).note.length < 3)
          return json(400, {
            error: { code: 'validation', message: 'x', fields: [{ field: 'note', reason: 'must say why' }] },
          });
        return json(201, { id: 'q1', lot: '7K2QM9XAT', seq: 1, kind: 'exhibit-added', status: 'open' });
      }),
    );
    const user = userEvent.setup();
    render(
      <QueryClientProvider client={testClient()}>
        <RemovalRequestAction code="7K2QM9XAT" state={{} as never} viewer={holder} close={() => undefined} />
      </QueryClientProvider>,
    );
    const dialog = await screen.findByRole('dialog');
    await within(dialog).findByRole('option', { name: /Entry 1 · exhibit-added/ });
    await user.type(within(dialog).getByRole('textbox', { name: /Why it should go/ }), 'no');
    await user.click(within(dialog).getByRole('button', { name: 'Send the request' }));
    expect(await within(dialog).findByText('must say why')).toBeInTheDocument();
    await user.type(
      within(dialog).getByRole('textbox', { name: /Why it should go/ }),
      ': my house is in the photo',
    );
    await user.click(within(dialog).getByRole('button', { name: 'Send the request' }));
    await within(dialog).findByText(/Your request is with the registrar/);
    expect(calls.at(-1)!.url).toBe('/api/lots/7K2QM9XAT/redaction-requests');
    expect(JSON.parse(calls.at(-1)!.body)).toEqual({ seq: 1, note: 'no: my house is in the photo' });
  });
});

describe('registrar pages', () => {
  const serve = (extra: (url: string) => Response | undefined) => stubServer(registrar, extra);

  it('runs the audit with progress and lists the broken rolls', async () => {
    const lines = [
      { type: 'start', lots: 3, startedAt: '2026-05-01T10:00:00Z' },
      {
        type: 'broken',
        lot: '7K2QM9XAT',
        seq: 2,
        reason: 'bad-body-digest',
        message: 'the body does not match',
      },
      { type: 'progress', lotsChecked: 3, lots: 3, entriesChecked: 11 },
      {
        type: 'done',
        lotsChecked: 3,
        entriesChecked: 11,
        broken: 1,
        ok: false,
        finishedAt: '2026-05-01T10:00:01Z',
      },
    ];
    serve((url) =>
      url === '/api/audit/ledger'
        ? new Response(lines.map((l) => JSON.stringify(l)).join('\n') + '\n', {
            headers: { 'Content-Type': 'application/x-ndjson' },
          })
        : undefined,
    );
    const user = userEvent.setup();
    renderAt('/registry/audit');
    await user.click(await screen.findByRole('button', { name: 'Run the audit' }));
    expect(await screen.findByText('1 of 3 rolls are broken.')).toBeInTheDocument();
    expect(screen.getByText('3 of 3 lots checked, 11 entries')).toBeInTheDocument();
    const table = screen.getByRole('table', { name: 'Broken rolls' });
    expect(within(table).getByText('7K2Q-M9XA-T')).toBeInTheDocument();
    expect(within(table).getByText('bad-body-digest')).toBeInTheDocument();
  });

  it('shows the report queue as a table with status', async () => {
    serve((url) =>
      url.startsWith('/api/registry/reports')
        ? json(200, {
            items: [
              {
                id: 'r1',
                lot: '7K2QM9XAT',
                category: 'wrong-attribution',
                text: 'These are later copies.',
                answerWanted: false,
                reporterEmail: null,
                status: 'open',
                resolution: null,
                closedAt: null,
                createdAt: '2026-05-01T10:00:00Z',
              },
            ],
            total: 1,
            page: 1,
            pageSize: 20,
          })
        : undefined,
    );
    renderAt('/registry/reports');
    const table = await screen.findByRole('table', { name: 'Reports' });
    expect(await within(table).findByText('These are later copies.')).toBeInTheDocument();
    expect(within(table).getByText('Wrong attribution claim')).toBeInTheDocument();
    expect(within(table).getByText('Open')).toBeInTheDocument();
  });
});
