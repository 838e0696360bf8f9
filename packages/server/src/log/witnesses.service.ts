import { ApiProperty } from '@nestjs/swagger';
import { Injectable } from '@nestjs/common';
import {
  NOTE_SIG_COSIGNATURE,
  NoteError,
  parseCheckpoint,
  parseNote,
  parseVerifierKey,
  verifyCosignature,
  type VerifierKey,
} from '@beadroll/core';
import { DataSource } from 'typeorm';
import { AppError } from '../common/app-error';
import { CheckpointsService } from './checkpoints.service';

/** A registered witness as the registrar's screen shows it. */
export class WitnessResponse {
  @ApiProperty() id: string;
  @ApiProperty() name: string;
  @ApiProperty() key: string;
  @ApiProperty() registeredAt: string;
  @ApiProperty({ type: String, nullable: true }) lastCosignedAt: string | null;
  @ApiProperty({ type: Number, nullable: true }) lastCosignedSize: number | null;
}

/** The registered witnesses, with the key of the log they watch. */
export class WitnessListResponse {
  @ApiProperty() logKey: string;
  @ApiProperty({ type: [WitnessResponse] }) items: WitnessResponse[];
}

interface WitnessRow {
  id: string;
  name: string;
  key: string;
  registered_at: Date;
  last_cosigned_at: Date | null;
  last_cosigned_size: string | null;
}

function toWitnessResponse(r: WitnessRow): WitnessResponse {
  return {
    id: r.id,
    name: r.name,
    key: r.key,
    registeredAt: r.registered_at.toISOString(),
    lastCosignedAt: r.last_cosigned_at?.toISOString() ?? null,
    lastCosignedSize: r.last_cosigned_size === null ? null : Number(r.last_cosigned_size),
  };
}

/**
 * Witnesses of the ledger-wide log: the registrar registers their cosignature keys (C2SP
 * tlog-cosignature, type 0x04); a cosignature is kept only from a registered key, for a
 * checkpoint this log signed, and only if it verifies.
 */
@Injectable()
export class WitnessesService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly checkpoints: CheckpointsService,
  ) {}

  async list(): Promise<WitnessResponse[]> {
    const rows: WitnessRow[] = await this.dataSource.query(
      `SELECT "id", "name", "key", "registered_at", "last_cosigned_at", "last_cosigned_size"
         FROM "log_witnesses" ORDER BY "name"`,
    );
    return rows.map(toWitnessResponse);
  }

  async register(actor: string, keyText: string): Promise<WitnessResponse> {
    let key: VerifierKey;
    try {
      key = parseVerifierKey(keyText);
    } catch (e) {
      throw AppError.validation([{ field: 'key', reason: (e as Error).message }]);
    }
    if (key.sigType !== NOTE_SIG_COSIGNATURE)
      throw AppError.validation([
        { field: 'key', reason: 'is not a witness cosignature key (its key type must be 04)' },
      ]);
    const rows: WitnessRow[] = await this.dataSource.query(
      `INSERT INTO "log_witnesses" ("name", "key", "registered_by") VALUES ($1, $2, $3)
       ON CONFLICT DO NOTHING
       RETURNING "id", "name", "key", "registered_at", "last_cosigned_at", "last_cosigned_size"`,
      [key.name, keyText, actor],
    );
    if (!rows[0]) throw new AppError('conflict', 'A witness with this name or key is already registered.');
    return toWitnessResponse(rows[0]);
  }

  /** Keeps one witness cosignature of a checkpoint this log signed. */
  async cosign(checkpointNote: string, line: string): Promise<{ size: number; witness: string }> {
    let text: string;
    let size: number;
    try {
      text = parseNote(checkpointNote).text;
      size = parseCheckpoint(text).size;
    } catch (e) {
      throw AppError.validation([{ field: 'checkpoint', reason: (e as Error).message }]);
    }
    const stored: Array<{ note: string }> = await this.dataSource.query(
      'SELECT "note" FROM "log_checkpoints" WHERE "origin" = $1 AND "size" = $2',
      [this.checkpoints.origin, size],
    );
    if (!stored[0] || parseNote(stored[0].note).text !== text)
      throw AppError.validation([{ field: 'checkpoint', reason: 'is not a checkpoint this log signed' }]);
    let sig;
    try {
      const sigs = parseNote(`${text}\n${line}\n`).signatures;
      if (sigs.length !== 1) throw new NoteError('bad-note', 'one signature line is expected');
      sig = sigs[0]!;
    } catch (e) {
      throw AppError.validation([{ field: 'cosignature', reason: (e as Error).message }]);
    }
    const witnesses: Array<{ id: string; key: string }> = await this.dataSource.query(
      'SELECT "id", "key" FROM "log_witnesses" WHERE "name" = $1',
      [sig.name],
    );
    const witness = witnesses[0];
    const key = witness ? parseVerifierKey(witness.key) : undefined;
    if (!witness || !key || key.keyId !== sig.keyId)
      throw new AppError('forbidden', 'This witness key is not registered with the registrar.');
    const time = verifyCosignature(text, sig, key);
    if (time === null)
      throw AppError.validation([
        { field: 'cosignature', reason: 'does not verify with the registered key' },
      ]);
    await this.dataSource.transaction(async (m) => {
      await m.query(
        `INSERT INTO "log_cosignatures" ("checkpoint_origin", "checkpoint_size", "witness_id", "line", "cosigned_time")
         VALUES ($1, $2, $3, $4, $5)
         ON CONFLICT ON CONSTRAINT "pk_log_cosignatures"
         DO UPDATE SET "line" = EXCLUDED."line", "cosigned_time" = EXCLUDED."cosigned_time", "received_at" = now()`,
        [this.checkpoints.origin, size, witness.id, sig.line, time],
      );
      await m.query(
        `UPDATE "log_witnesses" SET "last_cosigned_at" = now(),
                "last_cosigned_size" = GREATEST(COALESCE("last_cosigned_size", 0), $2)
          WHERE "id" = $1`,
        [witness.id, size],
      );
    });
    this.checkpoints.invalidate();
    return { size, witness: sig.name };
  }
}
