// Test data for the public page, built with the ledger core itself (the page must accept what
// the core writes). The scenario is the invented one of docs/examples/bundle.json; dealers,
// towns and lots do not exist.
import * as core from '@beadroll/core';
import type { Bundle, BundleEntry, BundleRoll } from '@beadroll/core';
import { buildExampleBundle } from '../../../../../tools/example-bundle.mjs';
import type { DealerCard, PublicLotResponse } from './public-lot.api';

export const DEALER_A = 'acct-3f9c1a';
export const DEALER_B = 'acct-7b20e4';
export const ASSESSOR = 'acct-a51d09';

const card = (id: string, displayName: string, business: string, town: string): DealerCard => ({
  id,
  handle: displayName.toLowerCase().replace(/\W+/g, '-'),
  displayName,
  business,
  town,
  country: 'Invented Shires',
  verifiedSince: '2024-11-02T09:00:00.000Z',
  status: 'verified',
});

export const CARDS: Record<string, DealerCard> = {
  [DEALER_A]: card(DEALER_A, 'Ines Varro', 'Varro Old Glass', 'Larkmoor'),
  [DEALER_B]: card(DEALER_B, 'Osric Pell', 'Pell & Daughter Beads', 'Sommerso Bridge'),
  [ASSESSOR]: card(ASSESSOR, 'Wren Abelard', 'Abelard Bead Studies', 'Fennick'),
};

/** The example bundle: [transfer lot, dissent lot, split parent, child 1, child 2, child 3]. */
export function exampleRolls(): BundleRoll[] {
  return (buildExampleBundle(core) as Bundle).rolls;
}

/** The public response for one roll of the example, with the rolls it links to after it. */
export function responseFor(rolls: BundleRoll[], ...indexes: number[]): PublicLotResponse {
  const chosen = indexes.map((i) => structuredClone(rolls[i]!));
  return { code: chosen[0]!.lot, bundle: core.createBundle(chosen), cards: CARDS };
}

/** SHA-256("abc"), FIPS 180-2 Appendix B.1 (one-block message). */
export const ABC_SHA256 = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';
export const ABC_BYTES = new TextEncoder().encode('abc');

/**
 * A listed lot with one photo whose web-sized file is the three bytes "abc", so the digest the
 * page must find is the published FIPS 180-2 value.
 */
export function lotWithPhoto(): PublicLotResponse {
  const random = core.seededRandom('public page photo lot');
  const lot = core.generateLotCode(random);
  const entries: BundleEntry[] = [];
  let head: core.RollHead | null = null;
  const add = (draft: Omit<core.EntryDraft, 'lot'>) => {
    const b = core.buildEntry(head, { ...draft, lot } as core.EntryDraft, { random });
    head = core.headOf(b);
    entries.push({ ...b.stored, logIndex: null });
  };
  add({
    kind: 'registered',
    time: '2025-04-01T10:00:00.000Z',
    actor: DEALER_A,
    body: {
      description: {
        title: 'Yellow satin beads with rose decoration',
        form: 'loose',
        count: { value: 12, estimated: false },
        colours: ['yellow'],
        baseGlass: ['satin'],
        decoration: ['roses'],
        listed: true,
      },
    },
  } as Omit<core.EntryDraft, 'lot'>);
  add({
    kind: 'exhibit-added',
    time: '2025-04-01T11:00:00.000Z',
    actor: DEALER_A,
    body: {
      exhibit: {
        kind: 'whole-lot',
        original: { sha256: core.sha256HexOfText('invented original'), size: 90000, mediaType: 'image/jpeg' },
        derivatives: [
          { role: 'web', sha256: ABC_SHA256, size: 3, mediaType: 'image/webp', width: 4, height: 3 },
        ],
        caption: 'Six beads on a grey card',
      },
    },
  } as Omit<core.EntryDraft, 'lot'>);
  return { code: lot, bundle: core.createBundle([{ lot, entries }]), cards: CARDS };
}
