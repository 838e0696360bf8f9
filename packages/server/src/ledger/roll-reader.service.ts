import { Injectable } from '@nestjs/common';
import {
  isLotCode,
  parseLotCode,
  type BundleEntry,
  type RollState,
  type SealedFieldName,
} from '@beadroll/core';
import { DataSource, type EntityManager } from 'typeorm';

/** A stored entry with the columns other features read without decoding the header. */
export interface StoredRollEntry extends BundleEntry {
  seq: number;
  kind: string;
  actor: string;
  time: string;
}

/** A sealed value the viewer may read, with what is needed to disclose it. */
export interface ViewerSealedField {
  seq: number;
  name: SealedFieldName;
  salt: string;
  value: unknown;
  commitment: string;
}

/** Identity and head of a stored lot. */
export interface LotHead {
  id: string;
  code: string;
  headSeq: number;
  headHash: string;
}

/**
 * Reads rolls as stored: exact header and body strings, for verifiers and bundles. Sealed
 * values are read only through {@link sealedFor}, for one named viewer.
 */
@Injectable()
export class RollReaderService {
  constructor(private readonly dataSource: DataSource) {}

  /** Canonical form of a code as typed (hyphens, case, I/L/O), or null when it is not a valid code. */
  static canonicalCode(text: string): string | null {
    if (typeof text !== 'string' || text.length > 20 || !isLotCode(text)) return null;
    return parseLotCode(text);
  }

  async findLot(code: string, manager: EntityManager = this.dataSource.manager): Promise<LotHead | null> {
    const rows: Array<{ id: string; code: string; head_seq: number; head_hash: string }> =
      await manager.query('SELECT "id", "code", "head_seq", "head_hash" FROM "lots" WHERE "code" = $1', [
        code,
      ]);
    const r = rows[0];
    return r ? { id: r.id, code: r.code, headSeq: r.head_seq, headHash: r.head_hash } : null;
  }

  /** A lot's id and its cached state (as of its head), by canonical code; null when unknown. */
  async cachedState(
    code: string,
    manager: EntityManager = this.dataSource.manager,
  ): Promise<{ id: string; state: RollState } | null> {
    const rows: Array<{ id: string; state: RollState }> = await manager.query(
      'SELECT "id", "state" FROM "lots" WHERE "code" = $1',
      [code],
    );
    return rows[0] ?? null;
  }

  /** The stored heads of many lots at once, by canonical code (unknown codes left out). */
  async findLots(codes: readonly string[]): Promise<LotHead[]> {
    if (codes.length === 0) return [];
    const rows: Array<{ id: string; code: string; head_seq: number; head_hash: string }> =
      await this.dataSource.query(
        'SELECT "id", "code", "head_seq", "head_hash" FROM "lots" WHERE "code" = ANY($1)',
        [codes],
      );
    return rows.map((r) => ({ id: r.id, code: r.code, headSeq: r.head_seq, headHash: r.head_hash }));
  }

  /** Entries of a lot in seq order, from `fromSeq`, at most `limit`. */
  async entries(
    lotId: string,
    opts: { fromSeq?: number; limit?: number; kinds?: string[] } = {},
    manager: EntityManager = this.dataSource.manager,
  ): Promise<StoredRollEntry[]> {
    const rows: Array<{
      seq: number;
      kind: string;
      actor: string;
      time: string;
      hash: string;
      header: string;
      body: string | null;
      log_index: string | null;
    }> = await manager.query(
      `SELECT e."seq", e."kind", e."actor", e."time", e."hash", e."header", b."body", e."log_index"
       FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id"
       WHERE e."lot_id" = $1 AND e."seq" >= $2 AND ($4::text[] IS NULL OR e."kind" = ANY($4))
       ORDER BY e."seq" LIMIT $3`,
      [lotId, opts.fromSeq ?? 0, opts.limit ?? 1_000_000, opts.kinds ?? null],
    );
    return rows.map((r) => ({
      seq: r.seq,
      kind: r.kind,
      actor: r.actor,
      time: r.time,
      hash: r.hash,
      header: r.header,
      body: r.body,
      logIndex: r.log_index === null ? null : Number(r.log_index),
    }));
  }

  /** The sealed fields of a lot's entries that `viewer` may read (none for anyone else). */
  async sealedFor(
    lotId: string,
    viewer: string,
    manager: EntityManager = this.dataSource.manager,
  ): Promise<ViewerSealedField[]> {
    const rows: Array<{
      seq: number;
      name: SealedFieldName;
      salt: string;
      value: string;
      commitment: string;
    }> = await manager.query(
      `SELECT e."seq", s."name", s."salt", s."value", s."commitment"
         FROM "sealed_fields" s JOIN "entries" e ON e."id" = s."entry_id"
         WHERE e."lot_id" = $1 AND $2 = ANY(s."visible_to") ORDER BY e."seq", s."name"`,
      [lotId, viewer],
    );
    return rows.map((r) => ({ ...r, value: JSON.parse(r.value) as unknown }));
  }

  /**
   * The named sealed fields that `viewer` may read, of many lots at once, per lot id in seq
   * order (the same rule as {@link sealedFor}: nobody else's values).
   */
  async sealedForLots(
    lotIds: readonly string[],
    viewer: string,
    names: readonly SealedFieldName[],
  ): Promise<Map<string, ViewerSealedField[]>> {
    const out = new Map<string, ViewerSealedField[]>();
    if (lotIds.length === 0 || names.length === 0) return out;
    const rows: Array<{
      lot_id: string;
      seq: number;
      name: SealedFieldName;
      salt: string;
      value: string;
      commitment: string;
    }> = await this.dataSource.query(
      `SELECT e."lot_id", e."seq", s."name", s."salt", s."value", s."commitment"
         FROM "sealed_fields" s JOIN "entries" e ON e."id" = s."entry_id"
        WHERE e."lot_id" = ANY($1::uuid[]) AND s."name" = ANY($3::text[]) AND $2 = ANY(s."visible_to")
        ORDER BY e."lot_id", e."seq", s."name"`,
      [lotIds, viewer, names],
    );
    for (const { lot_id, ...r } of rows) {
      const list = out.get(lot_id) ?? [];
      list.push({ ...r, value: JSON.parse(r.value) as unknown });
      out.set(lot_id, list);
    }
    return out;
  }

  /**
   * Every sealed value `accountId` may read, on any lot, ordered by lot code, seq and name (the
   * dealer's own data download).
   */
  async sealedVisibleTo(
    accountId: string,
  ): Promise<
    Array<{ lot: string; seq: number; name: string; value: string; salt: string; commitment: string }>
  > {
    return this.dataSource.query(
      `SELECT l."code" AS "lot", e."seq", s."name", s."value", s."salt", s."commitment"
         FROM "sealed_fields" s JOIN "entries" e ON e."id" = s."entry_id" JOIN "lots" l ON l."id" = e."lot_id"
        WHERE $1::text = ANY(s."visible_to") ORDER BY l."code", e."seq", s."name"`,
      [accountId],
    );
  }

  /**
   * The named sealed values `viewer` may read at the given entries (lot id and seq pairs), for
   * lists that show a price or note beside each row. Values are parsed.
   */
  async sealedAt(
    at: ReadonlyArray<{ lotId: string; seq: number }>,
    viewer: string,
    names: readonly SealedFieldName[],
  ): Promise<Array<{ lotId: string; seq: number; name: SealedFieldName; value: unknown }>> {
    if (at.length === 0 || names.length === 0) return [];
    const rows: Array<{ lot_id: string; seq: number; name: SealedFieldName; value: string }> =
      await this.dataSource.query(
        `SELECT e."lot_id", e."seq", s."name", s."value" FROM "sealed_fields" s JOIN "entries" e ON e."id" = s."entry_id"
          WHERE s."name" = ANY($4::text[]) AND $1 = ANY(s."visible_to")
            AND (e."lot_id", e."seq") IN (SELECT * FROM unnest($2::uuid[], $3::int[]))`,
        [viewer, at.map((a) => a.lotId), at.map((a) => a.seq), names],
      );
    return rows.map((r) => ({
      lotId: r.lot_id,
      seq: r.seq,
      name: r.name,
      value: JSON.parse(r.value) as unknown,
    }));
  }

  /** Commitments of every sealed field of the given entries (names and digests only). */
  async commitments(lotId: string, seqs: number[]): Promise<Map<number, Record<string, string>>> {
    const out = new Map<number, Record<string, string>>();
    if (seqs.length === 0) return out;
    const rows: Array<{ seq: number; name: string; commitment: string }> = await this.dataSource.query(
      `SELECT e."seq", s."name", s."commitment" FROM "sealed_fields" s JOIN "entries" e ON e."id" = s."entry_id"
       WHERE e."lot_id" = $1 AND e."seq" = ANY($2)`,
      [lotId, seqs],
    );
    for (const r of rows) out.set(r.seq, { ...(out.get(r.seq) ?? {}), [r.name]: r.commitment });
    return out;
  }
}
