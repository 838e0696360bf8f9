import { randomUUID } from 'node:crypto';
import type { LotDescription } from '@beadroll/core';
import type { Viewer } from '../../src/lots/lots.service';

/** An invented dealer (only the id and role matter to the services). */
export function dealer(): Viewer {
  return { id: randomUUID(), role: 'dealer' };
}

/** A small valid description of an invented lot. */
export function description(over: Partial<LotDescription> = {}): LotDescription {
  return {
    title: 'Wound beads with pink roses',
    summary: 'Strand of white wound beads, each with three pink roses and green leaves.',
    form: 'strand',
    count: { value: 40, estimated: false },
    diameterMm: { min: 8, max: 10.5 },
    strandLengthMm: 610,
    colours: ['white', 'pink', 'green'],
    baseGlass: ['opaque'],
    decoration: ['roses'],
    listed: true,
    ...over,
  };
}
