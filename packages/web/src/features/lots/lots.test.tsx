import {
  buildEntry,
  discloseSealedField,
  generateLotCode,
  seededRandom,
  type BuiltEntry,
  type LotDescription,
  type RollHead,
} from '@beadroll/core';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { json, renderAt, stubServer } from '../../common/testing/render';
import type { Me } from '../accounts/accounts.api';
import { LOT_ACTIONS } from './lot-actions';
import {
  clearDraft,
  draftToRequest,
  EMPTY_DRAFT,
  estimateBeads,
  inchesToMm,
  loadDraft,
  saveDraft,
} from './lot-draft';
import type { RawRoll } from './lots.api';

const ME: Me = {
  id: '5b0c3f7e-2a1d-4c3e-9f00-1a2b3c4d5e6f',
  role: 'dealer',
  status: 'verified',
  handle: 'mira-tallow',
  displayName: 'Mira Tallow',
  email: 'mira@example.invalid',
  business: 'Tallow Old Glass',
  town: 'Stringer Wick',
  country: 'Cullet Shires',
  emailVerified: true,
  verifiedSince: '2026-01-01T00:00:00.000Z',
  statusReason: null,
  createdAt: '2026-01-01T00:00:00.000Z',
};

const DESCRIPTION: LotDescription = {
  title: 'Pink rose wound beads',
  form: 'strand',
  count: { value: 50, estimated: true },
  strandLengthMm: 406.4,
  diameterMm: { min: 8, max: 8 },
  colours: ['white', 'pink'],
  baseGlass: ['opaque'],
  decoration: ['roses'],
  listed: false,
};

/** A real two-entry roll built with core, with the viewer's sealed storage location. */
function makeRoll(): { roll: RawRoll; code: string } {
  const random = seededRandom('lot page test');
  const code = generateLotCode(random);
  const reg: BuiltEntry = buildEntry(
    null,
    {
      lot: code,
      kind: 'registered',
      time: '2026-03-01T10:00:00.000Z',
      actor: ME.id,
      body: { description: DESCRIPTION },
      sealed: { 'storage-location': 'Box 4, top shelf' },
    },
    { random },
  );
  const head: RollHead = { lot: code, seq: 0, hash: reg.stored.hash, time: reg.header.time };
  const obs = buildEntry(
    head,
    {
      kind: 'observed',
      time: '2026-03-01T10:05:00.000Z',
      actor: ME.id,
      body: { observations: { hole: 'powder', windingMarks: 'seen' } },
    },
    { random },
  );
  const d = discloseSealedField(reg.sealed!, 'storage-location');
  return {
    code,
    roll: {
      lot: code,
      entries: [
        {
          ...reg.stored,
          seq: 0,
          kind: 'registered',
          actor: ME.id,
          time: reg.header.time,
          logIndex: null,
          sealed: [d],
        },
        { ...obs.stored, seq: 1, kind: 'observed', actor: ME.id, time: obs.header.time, logIndex: null },
      ],
    },
  };
}

/**
 * A valid version-1 roll: a listed lot, another dealer's note on it, then the registrar removes
 * the description that listed it after a newer one replaced it. Without that body the rule "others write only on a listed lot"
 * cannot be checked for the note (format, section 9.4), so the roll is unbroken but not fully
 * checkable.
 */
function makeRedactedV1Roll(): { roll: RawRoll; code: string } {
  const random = seededRandom('lot page v1 removal');
  const code = generateLotCode(random);
  const drafts = [
    { kind: 'registered', actor: ME.id, body: { description: DESCRIPTION } },
    { kind: 'described', actor: ME.id, body: { description: { ...DESCRIPTION, listed: true } } },
    { kind: 'note', actor: 'acct-other-dealer', body: { text: 'Seen at the spring fair.' } },
    {
      kind: 'described',
      actor: ME.id,
      body: { description: { ...DESCRIPTION, listed: true, title: 'Pink rose wound beads, restrung' } },
    },
    { kind: 'redacted', actor: 'acct-registrar', body: { target: 1, reason: 'personal-data' } },
  ] as const;
  let head: RollHead | null = null;
  const entries: RawRoll['entries'] = [];
  drafts.forEach((d, seq) => {
    const time = `2026-03-01T10:0${seq}:00.000Z`;
    const built: BuiltEntry = buildEntry(
      head,
      { ...(head ? {} : { lot: code }), kind: d.kind, time, actor: d.actor, body: d.body as never },
      { random, version: 1 },
    );
    head = { lot: code, seq, hash: built.stored.hash, time };
    entries.push({ ...built.stored, seq, kind: d.kind, actor: d.actor, time, logIndex: null });
  });
  entries[1] = { ...entries[1]!, body: null };
  return { code, roll: { lot: code, entries } };
}

describe('count helper', () => {
  it('estimates a 16 in strand of 8 mm beads at about 50', () => {
    // Worked value: 16 in × 25.4 = 406.4 mm; 406.4 ÷ 8 = 50.8, and bead charts list 50 for a
    // 16 in strand of 8 mm rounds ("Sizing and Bead Quantity for Round Bead Strands",
    // http://taszel14.blogspot.com/2008/02/sizing-and-bead-quantity-for-round-bead.html;
    // formula from "How Many Beads in a Strand", WireJewelry.com,
    // https://www.wirejewelry.com/jewelry_making_tips_techniques/How-Many-Beads-in-a-Strand_416.html).
    const mm = inchesToMm(16);
    expect(mm).toBe(406.4);
    const n = estimateBeads(mm, 8)!;
    expect(Math.abs(n - 50)).toBeLessThanOrEqual(1);
    // 18 in of 8 mm = 457.2 ÷ 8 = 57.15 ("How many beads per inch?", artbeads.com,
    // https://artbeads.com/how-many-beads-per-inch/).
    expect(estimateBeads(inchesToMm(18), 8)).toBe(57);
    expect(estimateBeads(0, 8)).toBeNull();
    expect(estimateBeads(400, 0)).toBeNull();
  });

  it('inches are 25.4 mm exactly (the international yard and pound agreement, 1959)', () => {
    expect(inchesToMm(1)).toBe(25.4);
    expect(inchesToMm(28)).toBe(711.2);
  });
});

describe('register form validation', () => {
  it('refuses a draft without a title or count and names the fields', () => {
    const { input, errors } = draftToRequest(EMPTY_DRAFT);
    expect(input).toBeNull();
    expect(Object.keys(errors).sort()).toEqual(['description.count.value', 'description.title']);
  });

  it('refuses bad lengths, a smallest size above the largest, and a bad currency', () => {
    const { errors } = draftToRequest({
      ...EMPTY_DRAFT,
      title: 'Lot',
      countValue: '10',
      diameterMin: '9',
      diameterMax: '6',
      strandLengthMm: '40.25',
      costAmount: '12.50',
      costCurrency: 'E1',
    });
    expect(errors['description.diameterMm.min']).toMatch(/larger than the largest/);
    expect(errors['description.strandLengthMm']).toMatch(/one decimal/);
    expect(errors['sealed.acquisition.cost.currency']).toMatch(/ISO 4217 code/);
  });

  it('builds the request: minor units of the currency, one size for both ends, observations kept', () => {
    const { input, errors } = draftToRequest({
      ...EMPTY_DRAFT,
      title: '  Green satin strand ',
      countValue: '48',
      countEstimated: true,
      diameterMax: '8',
      strandLengthMm: '406.4',
      colours: 'green, , white',
      costAmount: '45.5',
      costCurrency: 'EUR',
      storageLocation: 'Drawer B',
      observations: { uvA: 'none', note: ' ' },
    });
    expect(errors).toEqual({});
    expect(input).toEqual({
      description: {
        title: 'Green satin strand',
        form: 'strand',
        count: { value: 48, estimated: true },
        diameterMm: { min: 8, max: 8 },
        strandLengthMm: 406.4,
        colours: ['green', 'white'],
        baseGlass: [],
        decoration: [],
        listed: false,
      },
      observations: { uvA: 'none' },
      // EUR has 2 minor digits, JPY none (ISO 4217).
      sealed: { storageLocation: 'Drawer B', acquisition: { cost: { amount: 4550, currency: 'EUR' } } },
    });
    const yen = draftToRequest({
      ...EMPTY_DRAFT,
      title: 'x',
      countValue: '1',
      costAmount: '3000',
      costCurrency: 'JPY',
    });
    expect(yen.input?.sealed?.acquisition?.cost).toEqual({ amount: 3000, currency: 'JPY' });
  });

  it('keeps the description in local storage and the sealed fields only in session storage', () => {
    localStorage.clear();
    sessionStorage.clear();
    const stores = { local: localStorage, session: sessionStorage };
    const draft = {
      ...EMPTY_DRAFT,
      title: 'kept',
      storageLocation: 'Drawer B',
      acquisitionSource: 'Estate of Ada Quill',
      costAmount: '45.50',
      costCurrency: 'GBP',
      privateNote: 'paid too much',
    };
    saveDraft(draft, stores);
    expect(loadDraft(stores)).toEqual(draft);
    const lasting = Object.values({ ...localStorage }).join(' ');
    expect(lasting).toContain('kept');
    for (const secret of ['Drawer B', 'Ada Quill', '45.50', 'GBP', 'paid too much'])
      expect(lasting).not.toContain(secret);
    expect(Object.values({ ...sessionStorage }).join(' ')).toContain('45.50');

    // Closing the browser empties session storage: the description comes back, the sealed part does not.
    sessionStorage.clear();
    expect(loadDraft(stores)).toEqual({ ...EMPTY_DRAFT, title: 'kept' });

    clearDraft(stores);
    expect(localStorage.length).toBe(0);
    expect(sessionStorage.length).toBe(0);
  });

  it('never reads sealed fields from local storage, where an older draft may hold them', () => {
    localStorage.clear();
    sessionStorage.clear();
    localStorage.setItem(
      'beadroll.register-draft.v1',
      JSON.stringify({ title: 'old draft', costAmount: '12', acquisitionSource: 'auction' }),
    );
    const stores = { local: localStorage, session: sessionStorage };
    expect(loadDraft(stores)).toEqual({ ...EMPTY_DRAFT, title: 'old draft' });
    saveDraft(loadDraft(stores), stores);
    expect(localStorage.getItem('beadroll.register-draft.v1')).not.toMatch(/auction|costAmount/);
  });
});

describe('register form', () => {
  beforeEach(() => {
    localStorage.clear();
    sessionStorage.clear();
    stubServer(ME, (url, init) =>
      url === '/api/lots' && init?.method === 'POST'
        ? json(400, {
            error: {
              code: 'validation',
              message: 'Invalid',
              fields: [{ field: 'description.title', reason: 'title is already taken by the moon' }],
            },
          })
        : undefined,
    );
  });

  it('shows field errors from the form and from the server, keeps what was typed, marks private details', async () => {
    const user = userEvent.setup({ delay: null });
    renderAt('/lots/new');
    await screen.findByRole('heading', { name: 'Register a lot' });
    expect(screen.getAllByText(/seen only by you/).length).toBeGreaterThanOrEqual(2);
    await user.click(screen.getByRole('button', { name: 'Register the lot' }));
    expect(await screen.findByText(/Give the lot a title/)).toBeInTheDocument();
    expect(screen.getByText(/whole number/)).toBeInTheDocument();

    await user.type(screen.getByRole('textbox', { name: /Title/ }), 'Rose strand');
    await user.type(screen.getByRole('textbox', { name: /or in inches/ }), '16');
    await user.type(screen.getByRole('textbox', { name: /largest/ }), '8');
    expect(screen.getByRole('status', { name: 'Count helper' })).toHaveTextContent('≈ 51 beads');
    await user.click(screen.getByRole('button', { name: /Use 51 as an estimate/ }));
    expect(screen.getByRole('textbox', { name: /Number of beads/ })).toHaveValue('51');

    await user.click(screen.getByRole('radio', { name: /Green glow/ }));
    expect(screen.getByText(/365 nm/)).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Register the lot' }));
    expect(await screen.findByText('title is already taken by the moon')).toBeInTheDocument();
    expect(screen.getByRole('textbox', { name: /Title/ })).toHaveValue('Rose strand');
    expect(loadDraft()).toMatchObject({ title: 'Rose strand', strandLengthMm: '406.4' });
  }, 30_000);

  it('keeps typed private details out of local storage, and forgets the whole draft once registered', async () => {
    const { code } = makeRoll();
    stubServer(ME, (url, init) =>
      url === '/api/lots' && init?.method === 'POST' ? json(201, { code }) : undefined,
    );
    const user = userEvent.setup({ delay: null });
    renderAt('/lots/new');
    await screen.findByRole('heading', { name: 'Register a lot' });
    await user.type(screen.getByRole('textbox', { name: /Title/ }), 'Rose strand');
    await user.type(screen.getByRole('textbox', { name: /Number of beads/ }), '50');
    await user.type(screen.getByRole('textbox', { name: 'Acquired from' }), 'Estate of Ada Quill');
    await user.type(screen.getByRole('textbox', { name: 'Cost: amount' }), '45.50');
    await user.type(screen.getByRole('textbox', { name: 'Storage location' }), 'Drawer B');

    // Everything kept in local storage but the signed-in account remembered for pages opened
    // with no signal, which is no part of the draft.
    const lasting = () =>
      Object.entries({ ...localStorage })
        .filter(([key]) => key !== 'beadroll.session')
        .map(([, value]) => value)
        .join(' ');
    const session = () => Object.values({ ...sessionStorage }).join(' ');
    expect(lasting()).toContain('Rose strand');
    for (const secret of ['Ada Quill', '45.50', 'Drawer B']) {
      expect(lasting()).not.toContain(secret);
      expect(session()).toContain(secret);
    }

    await user.click(screen.getByRole('button', { name: 'Register the lot' }));
    await vi.waitFor(() => expect(lasting()).toBe(''));
    expect(session()).toBe('');
  }, 30_000);
});

describe('lot page', () => {
  it('verifies the raw roll in the browser and renders its timeline and the holder’s actions', async () => {
    const { roll, code } = makeRoll();
    stubServer(ME, (url) => (url === `/api/lots/${code}/roll` ? json(200, roll) : undefined));
    renderAt(`/lots/${code}`);
    expect(await screen.findByText('Verified in this browser')).toBeInTheDocument();
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent('Pink rose wound beads');
    const history = screen.getByRole('list');
    const items = within(history).getAllByRole('listitem');
    expect(items.map((i) => i.getAttribute('data-kind'))).toEqual(['observed', 'registered']);
    expect(items[0]).toHaveTextContent(/You recorded observations/);
    expect(items[0]).toHaveTextContent(roll.entries[1]!.hash.slice(0, 12));
    expect(screen.getByText('Box 4, top shelf')).toBeInTheDocument();
    expect(screen.getByText('406.4 mm (16 in)')).toBeInTheDocument();
    const actions = within(screen.getByRole('group', { name: 'Actions' })).getAllByRole('button');
    // The lot page's own actions come first; other features add theirs after.
    expect(actions.slice(0, 3).map((b) => b.textContent)).toEqual([
      'Describe',
      'Record observations',
      'List / unlist',
    ]);
    expect(LOT_ACTIONS.slice(0, 3).map((a) => a.id)).toEqual(['describe', 'observe', 'listing']);
  });

  it('marks an older roll whose removed entry leaves a rule unchecked', async () => {
    const { roll, code } = makeRedactedV1Roll();
    stubServer(ME, (url) => (url === `/api/lots/${code}/roll` ? json(200, roll) : undefined));
    renderAt(`/lots/${code}`);
    expect(await screen.findByText('Unbroken, but not fully checkable after a removal')).toBeInTheDocument();
    expect(screen.queryByText('Verified in this browser')).not.toBeInTheDocument();
    expect(screen.getByLabelText('Verification')).toHaveTextContent(
      /2 rules .*entry 1: the rules of described/,
    );
  });

  it('says so when the roll was tampered with, and shows no state from it', async () => {
    const { roll, code } = makeRoll();
    const body = roll.entries[1]!.body!.replace('powder', 'clean');
    roll.entries[1] = { ...roll.entries[1]!, body };
    stubServer(ME, (url) => (url === `/api/lots/${code}/roll` ? json(200, roll) : undefined));
    renderAt(`/lots/${code}`);
    expect(await screen.findByText('This roll does not verify')).toBeInTheDocument();
    expect(screen.queryByText('Box 4, top shelf')).not.toBeInTheDocument();
    expect(screen.queryByRole('group', { name: 'Actions' })).not.toBeInTheDocument();
  });
});
