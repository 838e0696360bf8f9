import { stat } from 'node:fs/promises';
import type { Readable } from 'node:stream';
import { requestFor, type ExhibitDerivative, type ExhibitFile, type ExhibitRef } from '@beadroll/core';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import pLimit from 'p-limit';
import { DataSource, type EntityManager, Repository } from 'typeorm';
import type { Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { LedgerService } from '../ledger/ledger.service';
import { BundleService } from '../ledger/bundle.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { LotsService } from '../lots/lots.service';
import { BlockedDigestsService } from '../registry/blocked-digests.service';
import { StandbyService, type ReadSource } from '../standby/standby.service';
import { lockBlobNames } from '../storage/blob-locks';
import { BLOB_STORE, type BlobStore } from '../storage/blob-store';
import { hashFile } from '../storage/hashing';
import type { AddExhibitDto } from './dto/add-exhibit.dto';
import {
  fileOfVariant,
  toExhibitResponse,
  type AddExhibitResponse,
  type ExhibitListResponse,
  type ExhibitVariant,
} from './dto/exhibit-response.dto';
import { ExhibitEntity } from './entities/exhibit.entity';
import { ExhibitProcessor, type ProcessedFile } from './exhibit-processor';
import type { UploadedExhibitFile } from './upload';
import { LotViewsService } from '../lots/lot-views.service';

/** A stored file ready to send, with what the response headers need. */
export interface ServedExhibitFile {
  stream: Readable;
  file: ExhibitFile;
  /** A name for the download, made from the lot and entry (never the uploader's file name). */
  downloadName: string;
  /** For a public file: where its rows were read (the hot standby or the primary). */
  from?: ReadSource;
}

const NOT_FOUND = () => new AppError('not_found', 'Not found.');

/** First key of the transaction advisory locks on an account's uploads ("BRQU"). */
const QUOTA_LOCK = 0x42525155;
const EXTENSIONS: Record<string, string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
  'image/avif': 'avif',
  'application/pdf': 'pdf',
};

@Injectable()
export class ExhibitsService {
  private readonly log = new Logger(ExhibitsService.name);
  /** Decoding a photo takes tens of MB: only a few uploads are processed at once. */
  private readonly processing: pLimit.Limit;

  constructor(
    private readonly views: LotViewsService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(BLOB_STORE) private readonly store: BlobStore,
    @InjectRepository(ExhibitEntity) private readonly exhibits: Repository<ExhibitEntity>,
    private readonly dataSource: DataSource,
    private readonly processor: ExhibitProcessor,
    private readonly ledger: LedgerService,
    private readonly lots: LotsService,
    private readonly blocked: BlockedDigestsService,
    private readonly bundles: BundleService,
    private readonly standby: StandbyService,
  ) {
    this.processing = pLimit(config.exhibits.processingConcurrency);
  }

  /**
   * Turns one uploaded file into one `exhibit-added` entry: checks and normalises it, then in
   * one transaction appends the entry, records where its files are and stores them. A sealed
   * exhibit (receipts always) goes on the roll only as a sealed-field commitment. Bytes the
   * registrar removed are refused (409 `blocked_content`); the quota is checked under a lock
   * held by the account's uploads until commit. When the transaction fails after files were
   * stored, the files this request wrote, and that no exhibit names, are removed again.
   */
  async add(
    actor: Principal,
    codeText: string,
    dto: AddExhibitDto,
    upload: UploadedExhibitFile | undefined,
  ): Promise<AddExhibitResponse> {
    if (!upload)
      throw AppError.validation([{ field: 'file', reason: 'is missing: attach one file as "file"' }]);
    const started = performance.now();
    const code = await this.lots.readableCode(actor, codeText);
    // Early refusals, before any decoding; the binding checks are repeated in the transaction.
    await this.checkQuota(this.dataSource.manager, actor.id, (await stat(upload.path)).size);
    // The bytes as sent (hashed as they were received): a stored original downloaded and sent
    // again is caught here, since re-encoding it would give other bytes.
    const sent = upload.sha256 ? { sha256: upload.sha256 } : await hashFile(upload.path);
    await this.blocked.assertAllowed([sent.sha256]);

    const checked = performance.now();
    const processed = await this.processing(() => this.processor.process(upload.path));
    try {
      const made = performance.now();
      const files = [processed.original, ...processed.derivatives];
      const described = await Promise.all(files.map((f) => describe(f)));
      const hashed = performance.now();
      const bytes = described.reduce((n, f) => n + f.size, 0);
      const digests = [...new Set([sent.sha256, ...described.map((f) => f.sha256)])];
      await this.blocked.assertAllowed(digests);
      const [original, ...derivatives] = described;
      const ref: ExhibitRef = {
        kind: dto.kind,
        original,
        derivatives: derivatives as ExhibitDerivative[],
        ...(dto.caption?.trim() ? { caption: dto.caption.trim() } : {}),
      };
      const sealed = dto.sealed === 'true' || dto.kind === 'receipt';

      const written: string[] = [];
      let row: ExhibitEntity;
      try {
        row = await this.ledger.withLots([code], async (tx) => {
          const m = tx.manager;
          // One upload of an account at a time from here to commit, on every server.
          await m.query('SELECT pg_advisory_xact_lock($1, hashtext($2))', [QUOTA_LOCK, actor.id]);
          await this.checkQuota(m, actor.id, bytes);
          // Shared locks on the names of every file to store, then a second look at the blocked
          // list. A redaction of the same bytes blocks them and holds these names exclusively
          // until it commits, so this look either comes after that commit and sees them blocked,
          // or the redaction waits for this upload to commit and then removes its files with
          // every other copy of those bytes. The locks stay until this transaction ends: a
          // failed upload's clean-up cannot sweep these files before the row names them.
          await lockBlobNames(
            m,
            described.map((f) => f.sha256),
            'shared',
          );
          await this.blocked.assertAllowed(digests, m);
          // An assessor asked about an unlisted lot (the read grant let them this far) names the
          // open request on the roll; core's rules admit their evidence by it.
          const state = tx.state(code);
          const request =
            actor.role === 'assessor' && !state.listed ? requestFor(state, actor.id) : undefined;
          const asked = request === undefined ? {} : { request };
          const entry = await tx.append(
            code,
            sealed
              ? {
                  kind: 'exhibit-added',
                  actor: actor.id,
                  body: { sealedOnly: true, ...asked },
                  sealed: { 'sealed-exhibit': ref },
                }
              : { kind: 'exhibit-added', actor: actor.id, body: { exhibit: ref, ...asked } },
            { fields: { 'body.exhibit.caption': 'caption', 'body.exhibit.kind': 'kind' } },
          );
          const lot = await tx.lock(code);
          const saved = await m.getRepository(ExhibitEntity).save(
            m.getRepository(ExhibitEntity).create({
              lotId: lot.id,
              lotCode: code,
              seq: entry.seq,
              addedBy: actor.id,
              sealed,
              originalSha256: original.sha256,
              sentSha256: sent.sha256,
              ref,
              bytes,
            }),
          );
          // Stored inside the transaction: if a put fails, no entry names missing files.
          for (const [i, f] of files.entries()) {
            const put = await this.store.put({ path: f.path });
            if (put.created) written.push(put.sha256);
            if (put.sha256 !== described[i].sha256)
              throw new AppError('internal', 'a file changed while it was being stored');
          }
          return saved;
        });
      } catch (err) {
        await this.removeUnnamed(written);
        throw err;
      }
      // Where an upload's time went, for tuning on a real machine (the request log has the total).
      const ms = (a: number, b: number) => `${Math.round(b - a)} ms`;
      this.log.debug(
        `exhibit ${code}#${row.seq}: checks ${ms(started, checked)}, images ${ms(checked, made)}, digests ${ms(made, hashed)}, entry and storage ${ms(hashed, performance.now())}`,
      );
      return {
        exhibit: toExhibitResponse(row, row.createdAt.toISOString(), this.base(code, false)),
        notes: processed.notes,
      };
    } finally {
      await processed.cleanup();
    }
  }

  /**
   * Whether an exhibit names the blob `digest` (its original or a derivative). Call it holding the
   * name's exclusive lock ({@link lockBlobNames}) to delete the blob when nothing names it.
   */
  async namesBlob(digest: string, m: EntityManager): Promise<boolean> {
    const named: unknown[] = await m.query(
      `SELECT 1 FROM "exhibits"
        WHERE "original_sha256" = $1
           OR "ref" -> 'derivatives' @> jsonb_build_array(jsonb_build_object('sha256', $1::text))
        LIMIT 1`,
      [digest],
    );
    return named.length > 0;
  }

  /**
   * Deletes blobs a failed upload wrote, unless an exhibit names them (the same bytes may have
   * been added elsewhere meanwhile: blobs are shared by content). Each name is checked and
   * deleted under an exclusive lock, so an upload storing the same bytes waits or re-writes.
   */
  private async removeUnnamed(digests: string[]): Promise<void> {
    for (const digest of new Set(digests)) {
      try {
        await this.dataSource.transaction(async (m) => {
          await lockBlobNames(m, [digest], 'exclusive');
          if (!(await this.namesBlob(digest, m))) await this.store.delete(digest);
        });
      } catch (err) {
        this.log.warn(`could not remove unnamed blob ${digest}: ${(err as Error).message}`);
      }
    }
  }

  /** The exhibits of a lot the viewer may read; sealed ones only to the dealer who added them. */
  async list(viewer: Principal, codeText: string): Promise<ExhibitListResponse> {
    const { code, upTo } = await this.lots.readAccess(viewer, codeText);
    const rows = await this.exhibits.find({ where: { lotCode: code }, order: { seq: 'ASC' } });
    return {
      exhibits: rows
        .filter((r) => upTo === null || r.seq <= upTo)
        .filter((r) => !r.sealed || r.addedBy === viewer.id)
        .map((r) => toExhibitResponse(r, r.createdAt.toISOString(), this.base(code, false))),
    };
  }

  /**
   * A file of a listed lot's public exhibit; anything else is the same bare 404. Its rows are
   * read from the hot standby while it is close enough behind, else (and always for a
   * signed-in `writer`) from the primary; the bytes come from the blob store either way.
   */
  async publicFile(
    codeText: string,
    seqText: string,
    variant: string,
    writer = false,
  ): Promise<ServedExhibitFile> {
    const code = RollReaderService.canonicalCode(codeText);
    if (!code) throw NOT_FOUND();
    return this.servePublic(code, seqText, variant, await this.readerOfListed(code, writer));
  }

  /**
   * A file of an exhibit recorded on an ancestor of a listed lot that the lot's public bundle
   * carries (an exhibit an opinion on an unlisted ancestor cites, or any public exhibit of a
   * listed ancestor). Anything else is the same bare 404.
   */
  async inheritedFile(
    codeText: string,
    ancestorText: string,
    seqText: string,
    variant: string,
    writer = false,
  ): Promise<ServedExhibitFile> {
    const code = RollReaderService.canonicalCode(codeText);
    const ancestor = RollReaderService.canonicalCode(ancestorText);
    if (!code || !ancestor || code === ancestor || !/^[1-9]\d{0,8}$/.test(seqText)) throw NOT_FOUND();
    const reader = await this.readerOfListed(code, writer);
    const bundle = await this.bundles.bundleFor(code, (_lot, state) => state.listed, reader.manager);
    const seq = Number(seqText);
    const carried = bundle?.rolls
      .find((r) => r.lot === ancestor)
      ?.entries.some((e) => {
        const h = JSON.parse(e.header) as { seq: number; kind: string };
        return h.seq === seq && h.kind === 'exhibit-added' && e.body !== null;
      });
    if (!carried) throw NOT_FOUND();
    return this.servePublic(ancestor, seqText, variant, reader);
  }

  /** Where a listed lot's public files are read from; any other lot is the same bare 404. */
  private async readerOfListed(
    code: string,
    writer: boolean,
  ): Promise<{ manager: EntityManager; from: ReadSource }> {
    const reader = await this.standby.reader(writer);
    if ((await this.views.find({ code }, reader.manager))?.listed !== true) throw NOT_FOUND();
    return reader;
  }

  /** The file of a public (unsealed) exhibit on `code`'s roll, read through `reader`. */
  private async servePublic(
    code: string,
    seqText: string,
    variant: string,
    reader: { manager: EntityManager; from: ReadSource },
  ): Promise<ServedExhibitFile> {
    const row = await this.row(code, seqText, reader.manager);
    if (!row || row.sealed) throw NOT_FOUND();
    return { ...(await this.serve(row, variant)), from: reader.from };
  }

  /** A file for a signed-in viewer who may read the lot; a sealed one only for its adder. */
  async viewerFile(
    viewer: Principal,
    codeText: string,
    seqText: string,
    variant: string,
  ): Promise<ServedExhibitFile> {
    const { code, upTo } = await this.lots.readAccess(viewer, codeText);
    const row = await this.row(code, seqText);
    if (!row || (upTo !== null && row.seq > upTo) || (row.sealed && row.addedBy !== viewer.id))
      throw NOT_FOUND();
    return this.serve(row, variant);
  }

  /** Whether any exhibit is stored for the lot (by canonical code). */
  async hasAny(code: string): Promise<boolean> {
    const has: unknown[] = await this.dataSource.query(
      'SELECT 1 FROM "exhibits" WHERE "lot_code" = $1 LIMIT 1',
      [code],
    );
    return has.length > 0;
  }

  /**
   * What is stored for the exhibit of entry `seq` of a lot: the digest of the file as it was sent
   * and the stored files (a sealed exhibit's too, which its public body does not name). Read in
   * the caller's transaction.
   */
  async storedAt(
    lotId: string,
    seq: number,
    m: EntityManager,
  ): Promise<Array<{ sent_sha256: string | null; ref: ExhibitRef | null }>> {
    return m.query('SELECT "sent_sha256", "ref" FROM "exhibits" WHERE "lot_id" = $1 AND "seq" = $2', [
      lotId,
      seq,
    ]);
  }

  /** The SHA-256 of each file an account sent, as sent, by lot code and seq (its own data download). */
  sentBy(accountId: string): Promise<Array<{ lot: string; seq: number; sha256: string }>> {
    return this.dataSource.query(
      `SELECT "lot_code" AS "lot", "seq", "sent_sha256" AS "sha256" FROM "exhibits"
        WHERE "added_by" = $1::text AND "sent_sha256" IS NOT NULL ORDER BY "lot_code", "seq"`,
      [accountId],
    );
  }

  private async row(code: string, seqText: string, manager?: EntityManager): Promise<ExhibitEntity | null> {
    if (!/^[1-9]\d{0,8}$/.test(seqText)) return null;
    const exhibits = manager ? manager.getRepository(ExhibitEntity) : this.exhibits;
    return exhibits.findOne({ where: { lotCode: code, seq: Number(seqText) } });
  }

  private async serve(row: ExhibitEntity, variant: string): Promise<ServedExhibitFile> {
    const file = fileOfVariant(row.ref, variant as ExhibitVariant);
    if (!file || !['original', 'web', 'thumb'].includes(variant)) throw NOT_FOUND();
    const stream = await this.store.get(file.sha256).catch(() => {
      throw NOT_FOUND();
    });
    const ext = EXTENSIONS[file.mediaType] ?? 'bin';
    return { stream, file, downloadName: `${row.lotCode}-${row.seq}-${variant}.${ext}` };
  }

  private base(code: string, isPublic: boolean): string {
    return isPublic ? `/api/public/lots/${code}/exhibits` : `/api/lots/${code}/exhibits`;
  }

  private async checkQuota(m: EntityManager, account: string, adding: number): Promise<void> {
    const quota = this.config.exhibits.quotaBytes;
    const rows: Array<{ used: string | null }> = await m.query(
      'SELECT SUM("bytes") AS "used" FROM "exhibits" WHERE "added_by" = $1',
      [account],
    );
    const used = Number(rows[0]?.used ?? 0);
    if (used + adding > quota)
      throw new AppError('payload_too_large', 'This account has used its exhibit storage.', [
        {
          field: 'file',
          reason: `would bring this account's exhibits to ${used + adding} bytes; the allowance is ${quota} bytes`,
        },
      ]);
  }
}

async function describe(f: ProcessedFile): Promise<ExhibitFile | ExhibitDerivative> {
  const { sha256, size } = await hashFile(f.path);
  return {
    ...(f.role ? { role: f.role } : {}),
    sha256,
    size,
    mediaType: f.mediaType,
    ...(f.width ? { width: f.width } : {}),
    ...(f.height ? { height: f.height } : {}),
  };
}
