import { Injectable } from '@nestjs/common';
import type { RedactedBody } from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { AppendProjector } from '../ledger/append-projector';
import type { AppendedEntry } from '../ledger/ledger.types';

/**
 * When an `exhibit-added` entry is redacted, its exhibit row goes in the same transaction, so
 * its files are no longer served for that (lot, entry). The blobs themselves stay until nothing
 * names them (another entry may hold the same bytes).
 */
@Injectable()
export class ExhibitRedactionProjector extends AppendProjector {
  async project(m: EntityManager, lotId: string, entry: AppendedEntry): Promise<void> {
    if (entry.kind !== 'redacted') return;
    const { target } = JSON.parse(entry.body) as RedactedBody;
    await m.query('DELETE FROM "exhibits" WHERE "lot_id" = $1 AND "seq" = $2', [lotId, target]);
  }
}
