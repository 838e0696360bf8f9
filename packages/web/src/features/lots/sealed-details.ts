import { verifySealedDisclosure, type Money, type VerifiedEntry } from '@beadroll/core';
import type { OwnSealedDetails, RollEntry } from './lots.api';

/** The viewer's own sealed details, the newest value of each, and how many failed their check. */
export interface CheckedSealedDetails {
  details: OwnSealedDetails;
  /** Values whose commitment does not match the verified entry header (never shown). */
  rejected: number;
}

/**
 * Opens the sealed values the server returned with the roll, keeping only those whose salted
 * commitment leads to the sealed root in the verified header of their entry.
 */
export function checkedSealedDetails(
  entries: readonly RollEntry[],
  verified: readonly VerifiedEntry[],
): CheckedSealedDetails {
  const details: OwnSealedDetails = {};
  let rejected = 0;
  for (const e of entries) {
    if (!e.sealed?.length) continue;
    const root = verified[e.seq]?.header.sealed;
    for (const f of e.sealed) {
      if (!root || !verifySealedDisclosure({ ...f, name: f.name as never }, root)) {
        rejected++;
        continue;
      }
      if (f.name === 'storage-location') details.storageLocation = f.value as string;
      if (f.name === 'acquisition-date') details.acquisitionDate = f.value as string;
      if (f.name === 'acquisition-source') details.acquisitionSource = f.value as string;
      if (f.name === 'acquisition-cost') details.acquisitionCost = f.value as Money;
      if (f.name === 'private-note') details.privateNote = f.value as string;
    }
  }
  return { details, rejected };
}
