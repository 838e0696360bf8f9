import { Injectable } from '@nestjs/common';
import {
  isLotCode,
  parseLotCode,
  type BundleEntry,
  type RollState,
  type SealedFieldName,
} from '@beadroll/core';
import { DataSource, type EntityManager } from 'typeorm';
import { readEntryRows } from './roll-replay';

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

  /** A lot's id, its cached state (as of its head) and its head's hash, by canonical code; null when unknown. */
  async cachedState(
    code: string,
    manager: EntityManager = this.dataSource.manager,
  ): Promise<{ id: string; state: RollState; headHash: string } | null> {
    const rows: Array<{ id: string; state: RollState; head_hash: string }> = await manager.query(
      'SELECT "id", "state", "head_hash" FROM "lots" WHERE "code" = $1',
      [code],
    );
    const r = rows[0];
    return r ? { id: r.id, state: r.state, headHash: r.head_hash } : null;
  }

  /** The cached states (as of their heads) of many lots at once, by canonical code (unknown codes left out). */
  async cachedStates(codes: readonly string[]): Promise<Map<string, RollState>> {
    const rows: Array<{ code: string; state: RollState }> = await this.dataSource.query(
      'SELECT "code", "state" FROM "lots" WHERE "code" = ANY($1)',
      [codes],
    );
    return new Map(rows.map((r) => [r.code, r.state]));
  }

  /** Every lot a lot was made from, through any number of splits and combinations (from the cached states). */
  async ancestorsOf(code: string): Promise<Set<string>> {
    const rows: Array<{ code: string }> = await this.dataSource.query(
      `WITH RECURSIVE "up"("code") AS (
         SELECT p->>'lot' FROM "lots" l, jsonb_array_elements(l."state"->'parents') p WHERE l."code" = $1
         UNION
         SELECT p->>'lot' FROM "up" u JOIN "lots" l ON l."code" = u."code", jsonb_array_elements(l."state"->'parents') p
       ) SELECT "code" FROM "up"`,
      [code],
    );
    return new Set(rows.map((r) => r.code));
  }

  /** The kinds of the entries at the given places (lot code and seq), keyed `code/seq`; unknown places left out. */
  async kindsAt(at: ReadonlyArray<{ code: string; seq: number }>): Promise<Map<string, string>> {
    const out = new Map<string, string>();
    if (at.length === 0) return out;
    const rows: Array<{ code: string; seq: number; kind: string }> = await this.dataSource.query(
      `SELECT l."code", e."seq", e."kind" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
       JOIN unnest($1::text[], $2::int[]) AS w("code", "seq") ON w."code" = l."code" AND w."seq" = e."seq"`,
      [at.map((a) => a.code), at.map((a) => a.seq)],
    );
    for (const r of rows) out.set(`${r.code}/${r.seq}`, r.kind);
    return out;
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
    const rows = await readEntryRows(manager, lotId, opts);
    return rows.map(({ seq, kind, actor, time, hash, header, body, logIndex }) => ({
      seq,
      kind,
      actor,
      time,
      hash,
      header,
      body,
      logIndex,
    }));
  }

  /** The stored bodies of a lot's entries of one kind, by canonical code (redacted bodies left out). */
  async bodiesOfKind(
    code: string,
    kind: string,
    manager: EntityManager = this.dataSource.manager,
  ): Promise<string[]> {
    const rows: Array<{ body: string }> = await manager.query(
      `SELECT b."body" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
       JOIN "entry_bodies" b ON b."entry_id" = e."id"
       WHERE l."code" = $1 AND e."kind" = $2`,
      [code, kind],
    );
    return rows.map((r) => r.body);
  }

  /**
   * The stored body of a lot's newest entry of one kind, leaving out the entry at `exceptSeq`
   * and redacted bodies; null when there is none. Read in the caller's transaction.
   */
  async latestBody(
    lotId: string,
    kind: string,
    exceptSeq: number,
    manager: EntityManager,
  ): Promise<string | null> {
    const rows: Array<{ body: string }> = await manager.query(
      `SELECT b."body" FROM "entries" e JOIN "entry_bodies" b ON b."entry_id" = e."id"
       WHERE e."lot_id" = $1 AND e."kind" = $2 AND e."seq" <> $3 ORDER BY e."seq" DESC LIMIT 1`,
      [lotId, kind, exceptSeq],
    );
    return rows[0]?.body ?? null;
  }

  /** Whether a lot (by canonical code) has any entry of this kind. */
  async hasEntryOfKind(code: string, kind: string): Promise<boolean> {
    const rows: unknown[] = await this.dataSource.query(
      `SELECT 1 FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id" WHERE l."code" = $1 AND e."kind" = $2 LIMIT 1`,
      [code, kind],
    );
    return rows.length > 0;
  }

  /** How many entries of one kind `actor` appended to a lot (by canonical code) after `since`. */
  async countSince(
    code: string,
    kind: string,
    actor: string,
    since: string,
    manager: EntityManager = this.dataSource.manager,
  ): Promise<number> {
    const [{ n }] = (await manager.query(
      `SELECT count(*)::int AS "n" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
       WHERE l."code" = $1 AND e."kind" = $2 AND e."actor" = $3 AND e."time" > $4`,
      [code, kind, actor, since],
    )) as Array<{ n: number }>;
    return n;
  }

  /**
   * Every entry `actor` wrote, on any lot, with its exact header and body (null once redacted),
   * ordered by lot code and seq (the account's own data download).
   */
  entriesBy(actor: string): Promise<
    Array<{
      lot: string;
      seq: number;
      kind: string;
      time: string;
      hash: string;
      header: string;
      body: string | null;
    }>
  > {
    return this.dataSource.query(
      `SELECT l."code" AS "lot", e."seq", e."kind", e."time", e."hash", e."header", b."body"
         FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id" LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id"
        WHERE e."actor" = $1::text ORDER BY l."code", e."seq"`,
      [actor],
    );
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
