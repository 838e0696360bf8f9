import type { RedactionRequestResponse, RedactionResponse } from './dto/registry-responses.dto';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { ExhibitAddedBody, RedactionReason } from '@beadroll/core';
import type { Repository } from 'typeorm';
import { AppError } from '../common/app-error';
import { ExhibitsService } from '../exhibits/exhibits.service';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { lockBlobNames } from '../storage/blob-locks';
import { BLOB_STORE, type BlobStore } from '../storage/blob-store';
import { BlockedDigestsService } from './blocked-digests.service';
import { RedactionRequest, type RedactionRequestStatus } from './entities/redaction-request.entity';
import { RegistrarRecordService } from './registrar-record.service';
import { LotViewsService } from '../lots/lot-views.service';

function toRequestResponse(r: RedactionRequest, kind: string): RedactionRequestResponse {
  return {
    id: r.id,
    lot: r.lot,
    seq: r.seq,
    kind,
    requester: r.requester,
    note: r.note,
    status: r.status,
    decidedBy: r.decidedBy,
    decidedAt: r.decidedAt?.toISOString() ?? null,
    decisionNote: r.decisionNote,
    createdAt: r.createdAt.toISOString(),
  };
}

function seqProblem(reason: string): AppError {
  return AppError.validation([{ field: 'seq', reason }]);
}

/** Digests of every stored file an exhibit entry names (original and derivatives). */
export function exhibitDigests(body: ExhibitAddedBody): string[] {
  if (!('exhibit' in body)) return [];
  return [body.exhibit.original.sha256, ...body.exhibit.derivatives.map((d) => d.sha256)];
}

/**
 * Redaction: the registrar removes an entry's body (and an exhibit's files) through the
 * ledger's one redaction path; the `redacted` entry names the entry and the reason, the
 * digests stay and the roll still verifies. Holders may ask for their own entries.
 */
@Injectable()
export class RedactionsService {
  private readonly log = new Logger(RedactionsService.name);

  constructor(
    private readonly views: LotViewsService,
    private readonly ledger: LedgerService,
    private readonly reader: RollReaderService,
    private readonly blocked: BlockedDigestsService,
    private readonly record: RegistrarRecordService,
    private readonly exhibits: ExhibitsService,
    @InjectRepository(RedactionRequest) private readonly requests: Repository<RedactionRequest>,
    @Inject(BLOB_STORE) private readonly blobs: BlobStore,
  ) {}

  private async codeOf(text: string): Promise<string> {
    const code = RollReaderService.canonicalCode(text);
    if (!code) throw AppError.validation([{ field: 'lot', reason: 'is not a lot code' }]);
    if (!(await this.reader.findLot(code))) throw new AppError('not_found', 'No lot with this code.');
    return code;
  }

  /** Removes the body of entry `seq` of `lotText`. Nothing changes when anything is refused. */
  async redact(
    registrar: string,
    lotText: string,
    seq: number,
    reason: RedactionReason,
    note: string | null,
    requestId?: string,
  ): Promise<RedactionResponse> {
    const code = await this.codeOf(lotText);
    const result = await this.ledger.withLots([code], async (tx) => {
      const head = tx.state(code).head.seq;
      if (seq > head) throw seqProblem(`lot ${code} has no entry ${seq} (its newest is ${head})`);
      const lot = await this.reader.findLot(code, tx.manager);
      const [target] = await this.reader.entries(lot!.id, { fromSeq: seq, limit: 1 }, tx.manager);
      if (!target || target.seq !== seq) throw seqProblem(`lot ${code} has no entry ${seq}`);
      if (target.body === null) throw seqProblem(`entry ${seq} is already redacted`);
      // Read before the redaction deletes the exhibit's row: the file as the dealer sent it is
      // blocked too, so the same upload is refused even if normalising it would now give other
      // bytes. That digest stays on the server: it is not in the response or the record.
      // The row also names the stored files of a sealed exhibit, whose public body does not.
      const rows =
        target.kind === 'exhibit-added' ? await this.exhibits.storedAt(lot!.id, seq, tx.manager) : [];
      let entry;
      try {
        entry = await tx.redact(code, registrar, seq, reason);
      } catch (e) {
        if (e instanceof AppError && e.code === 'roll_rule') throw seqProblem(e.message);
        throw e;
      }
      const digests =
        target.kind === 'exhibit-added' ? exhibitDigests(JSON.parse(target.body) as ExhibitAddedBody) : [];
      // Every stored file goes, a sealed exhibit's too; the answer names only the public ones.
      const stored = [
        ...new Set([
          ...digests,
          ...rows.flatMap((r) =>
            r.ref ? [r.ref.original.sha256, ...r.ref.derivatives.map((d) => d.sha256)] : [],
          ),
        ]),
      ];
      const asSent = rows.flatMap((r) => (r.sent_sha256 ? [r.sent_sha256] : []));
      await this.blocked.block([...stored, ...asSent], { lot: code, seq, reason }, tx.manager);
      // The names of the files to delete, exclusively until commit, after blocking their bytes in
      // this transaction. An upload storing the same bytes holds them shared: this waits until it
      // has committed, and its entry then loses the files with every other copy. An upload that
      // comes later waits for this commit and its look at the blocked list afterwards refuses it.
      await lockBlobNames(tx.manager, stored, 'exclusive');
      await this.record.record(
        {
          actor: registrar,
          action: 'redacted',
          subject: `${code}/${seq}`,
          reason: note,
          details: { lot: code, seq, kind: target.kind, reason, redactionSeq: entry.seq, requestId },
        },
        tx.manager,
      );
      if (requestId) {
        await tx.manager.getRepository(RedactionRequest).update(
          { id: requestId, status: 'open' },
          {
            status: 'approved',
            decidedBy: registrar,
            decidedAt: new Date(),
            decisionNote: note,
          },
        );
      }
      return {
        response: {
          lot: code,
          seq,
          redactionSeq: entry.seq,
          reason,
          time: entry.time,
          blockedDigests: digests,
        },
        stored,
      };
    });
    // Files go after the transaction commits: a failed commit must not lose a file still named.
    // Blobs are named by their bytes, so a copy of the same file on another lot goes too: the
    // bytes are blocked everywhere from now on. No upload can store them again from the commit
    // on (it would have to pass the blocked list after taking the names' lock), so deleting
    // needs no lock of its own.
    for (const d of result.stored) await this.blobs.delete(d);
    this.log.log(`redacted ${code} seq ${seq} (${reason})`);
    return result.response;
  }

  /** A holder asks the registrar to remove one of the holder's own entries. */
  async request(
    requester: string,
    lotText: string,
    seq: number,
    note: string,
  ): Promise<RedactionRequestResponse> {
    const code = await this.codeOf(lotText);
    const lot = await this.reader.findLot(code);
    const [target] = await this.reader.entries(lot!.id, { fromSeq: seq, limit: 1 });
    if (!target || target.seq !== seq) throw seqProblem(`lot ${code} has no entry ${seq}`);
    const view = await this.views.find({ code }, this.requests.manager);
    if (view?.holder !== requester || target.actor !== requester)
      throw new AppError('forbidden', 'Only the holder can ask for the removal of their own entries.');
    if (target.body === null) throw seqProblem(`entry ${seq} is already redacted`);
    const open = await this.requests.findOne({ where: { lot: code, seq, status: 'open' } });
    if (open) throw new AppError('conflict', 'A request to remove this entry is already waiting.');
    const saved = await this.requests.save(this.requests.create({ lot: code, seq, requester, note }));
    return toRequestResponse(saved, target.kind);
  }

  async listRequests(status: RedactionRequestStatus): Promise<RedactionRequestResponse[]> {
    const rows = await this.requests.find({ where: { status }, order: { createdAt: 'ASC' }, take: 500 });
    const kinds = new Map<string, string>();
    for (const r of rows) {
      const lot = await this.reader.findLot(r.lot);
      const [e] = lot ? await this.reader.entries(lot.id, { fromSeq: r.seq, limit: 1 }) : [];
      kinds.set(r.id, e?.kind ?? 'unknown');
    }
    return rows.map((r) => toRequestResponse(r, kinds.get(r.id)!));
  }

  private async openRequest(id: string): Promise<RedactionRequest> {
    const r = await this.requests.findOne({ where: { id } });
    if (!r) throw new AppError('not_found', 'No such redaction request.');
    if (r.status !== 'open') throw new AppError('conflict', `This request was already ${r.status}.`);
    return r;
  }

  async approve(registrar: string, id: string, note: string | null): Promise<RedactionResponse> {
    const r = await this.openRequest(id);
    return this.redact(registrar, r.lot, r.seq, 'holder-request', note, r.id);
  }

  async decline(registrar: string, id: string, note: string): Promise<RedactionRequestResponse> {
    const r = await this.openRequest(id);
    return this.requests.manager.transaction(async (m) => {
      r.status = 'declined';
      r.decidedBy = registrar;
      r.decidedAt = new Date();
      r.decisionNote = note;
      await m.getRepository(RedactionRequest).save(r);
      await this.record.record(
        {
          actor: registrar,
          action: 'redaction-declined',
          subject: `${r.lot}/${r.seq}`,
          reason: note,
          details: { lot: r.lot, seq: r.seq, requestId: r.id },
        },
        m,
      );
      return toRequestResponse(r, 'unknown');
    });
  }
}
