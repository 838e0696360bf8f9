import 'fake-indexeddb/auto';
import {
  buildEntry,
  generateLotCode,
  seededRandom,
  type BuiltEntry,
  type EntryDraft,
  type EntryKind,
  type RollHead,
} from '@beadroll/core';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { accounts, json, renderAt, stubServer } from '../../common/testing/render';
import { dismissQueuedWrite, readOutbox } from '../../lib/outbox';
import type { RawRoll } from '../lots/lots.api';

const dealer = accounts.dealer;
const OTHER = '6f1c1f7e-8a55-4b43-9a43-0000000000c3';

/** A real roll built with core: the dealer registers a strand, then whatever `more` adds. */
function rollOf(seed: string, more: Omit<EntryDraft<EntryKind>, 'lot'>[]): RawRoll {
  const random = seededRandom(seed);
  const code = generateLotCode(random);
  const entries: RawRoll['entries'] = [];
  let head: RollHead | null = null;
  const inputs: EntryDraft<EntryKind>[] = [
    {
      lot: code,
      kind: 'registered',
      time: '2026-04-01T10:00:00.000Z',
      actor: dealer.id,
      body: {
        description: {
          title: 'Blue lampwork strand',
          form: 'strand',
          count: { value: 40, estimated: false },
          colours: ['blue'],
          baseGlass: ['transparent'],
          decoration: [],
          listed: true,
        },
      },
    },
    ...more.map((m) => ({ ...m, lot: code })),
  ];
  for (const input of inputs) {
    const built: BuiltEntry = buildEntry(head, input, { random });
    const seq: number = head ? head.seq + 1 : 0;
    entries.push({
      ...built.stored,
      seq,
      kind: input.kind,
      actor: input.actor,
      time: input.time,
      logIndex: null,
    });
    head = { lot: code, seq, hash: built.stored.hash, time: input.time };
  }
  return { lot: code, entries };
}

/** The server: the tag lookup answers with `row` (a list row, which may lag), the roll as stored. */
function serve(roll: RawRoll, row: { status: string }) {
  stubServer(dealer, (url) => {
    if (url === `/api/tags/lots/${roll.lot}`)
      return json(200, {
        code: roll.lot,
        held: true,
        title: 'Blue lampwork strand',
        listed: true,
        status: row.status,
        seq: roll.entries.length - 1,
        ref: 'ABCDEFGHJK',
      });
    if (url === `/api/lots/${roll.lot}/roll`) return json(200, roll);
    return undefined;
  });
}

describe('the scanned lot page', () => {
  it('offers no sale or offer when the verified roll has an open offer, whatever the list row says', async () => {
    const roll = rollOf('scanned offered', [
      {
        kind: 'transfer-offered',
        time: '2026-04-02T10:00:00.000Z',
        actor: dealer.id,
        body: { recipient: OTHER },
      },
    ]);
    serve(roll, { status: 'held' });
    renderAt(`/scan/lots/${roll.lot}`);
    expect(await screen.findByText(/Status: offered/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Sell' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Offer to a dealer' })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'History' })).toBeInTheDocument();
  });

  it('offers the sale and the offer when the verified roll says the dealer holds it, whatever the list row says', async () => {
    const roll = rollOf('scanned held', []);
    serve(roll, { status: 'offered' });
    renderAt(`/scan/lots/${roll.lot}`);
    expect(await screen.findByRole('button', { name: 'Sell' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Offer to a dealer' })).toBeInTheDocument();
    expect(screen.getByText(/Status: held/)).toBeInTheDocument();
  });

  describe('with no signal', () => {
    afterEach(async () => {
      vi.restoreAllMocks();
      for (const w of await readOutbox()) await dismissQueuedWrite(w.key);
    });

    it('keeps an offer to an e-mail address on this device and shows it waiting', async () => {
      const roll = rollOf('scanned no signal', []);
      vi.spyOn(navigator, 'onLine', 'get').mockReturnValue(false);
      const calls = stubServer(dealer, (url) => {
        if (url.startsWith('/api/tags/') || url.startsWith('/api/lots/')) throw new TypeError('no signal');
        return undefined;
      });
      const user = userEvent.setup();
      renderAt(`/scan/lots/${roll.lot}`);
      await screen.findByText(/No signal: the lot’s details cannot be looked up now/);
      await user.click(screen.getByRole('button', { name: 'Offer to a dealer' }));
      expect(await screen.findByText(/No signal: finding a dealer by name needs one/)).toBeInTheDocument();
      // The dealer search needs a signal: the dialog starts on the e-mail address.
      expect(screen.getByRole('radio', { name: 'An e-mail address' })).toBeChecked();
      await user.type(screen.getByLabelText('Their e-mail address'), 'wren@example.invalid');
      await user.click(screen.getByRole('button', { name: 'Send the offer' }));
      expect(await screen.findByText('Offer recorded on this device: waiting to send.')).toBeInTheDocument();
      expect(screen.queryByRole('button', { name: 'Sell' })).not.toBeInTheDocument();
      expect(screen.queryByRole('button', { name: 'Offer to a dealer' })).not.toBeInTheDocument();
      expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
      const kept = await readOutbox();
      expect(kept).toHaveLength(1);
      expect(kept[0]).toMatchObject({
        path: '/api/transfers/offers',
        method: 'POST',
        body: { lot: roll.lot, email: 'wren@example.invalid' },
        account: dealer.id,
      });
    });
  });
});
