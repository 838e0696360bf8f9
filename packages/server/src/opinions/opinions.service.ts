import { partyCard, PartyCard } from '../accounts/dto/dealer-card.dto';
import { Inject, Injectable } from '@nestjs/common';
import {
  attributionAid,
  inheritedRecord,
  verifyRoll,
  type EntryHeader,
  type ParentRef,
  type AidInput,
  type AidResult,
  type ExhibitAddedBody,
  type NoteBody,
  type OpinionWithdrawnBody,
  type OpinionBody,
  type RollState,
  mayAppend,
  requestFor,
} from '@beadroll/core';
import { AccountsService } from '../accounts/accounts.service';
import { DealerCardsService } from '../accounts/dealer-cards.service';
import type { Principal } from '../auth/auth.decorators';
import { AppError, type FieldProblem } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { LedgerClock } from '../ledger/ledger.clock';
import { LedgerService, type RollTransaction } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { requireMayAppend } from '../ledger/roll-rule.error';
import { LotsService } from '../lots/lots.service';
import { MailService } from '../mail/mail.service';
import { OpinionRequestsService } from './opinion-requests.service';
import type { AttributionAidDto } from './dto/aid-request.dto';
import type { RecordOpinionDto, ReplyDto, WithdrawOpinionDto } from './dto/opinion-requests.dto';
import type {
  LotOpinionsResponse,
  OpinionRole,
  OpinionView,
  OpinionWriteResponse,
} from './dto/opinion-responses.dto';
import { opinionLetters } from './opinion-letters';

type Writer = Pick<Principal, 'id' | 'role'>;

const DAY_MS = 86_400_000;

/** Plain data from a validated DTO (class instances → the JSON shapes core expects). */
function plain<T>(dto: unknown): T {
  return JSON.parse(JSON.stringify(dto)) as T;
}

function roleOf(state: RollState, seq: number): OpinionRole {
  if (state.attribution?.seq === seq) return 'attribution';
  if (state.dissents.some((d) => d.seq === seq)) return 'dissent';
  return 'other';
}

/**
 * Attribution opinions on lots: recorded, withdrawn and answered through the ledger's one
 * append path. Attribution and dissent are never stored by this feature: core's reducer derives
 * them from the roll whenever it is read.
 */
@Injectable()
export class OpinionsService {
  constructor(
    private readonly ledger: LedgerService,
    private readonly lots: LotsService,
    private readonly reader: RollReaderService,
    private readonly requests: OpinionRequestsService,
    private readonly cards: DealerCardsService,
    private readonly mail: MailService,
    private readonly clock: LedgerClock,
    private readonly accounts: AccountsService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  /** Runs core's attribution aid; it reads nothing and writes nothing. */
  aid(dto: AttributionAidDto): AidResult {
    return attributionAid(plain<AidInput>(dto));
  }

  /** Records an opinion; e-mails the holder when core's reducer reads it as a dissent. */
  async record(me: Writer, text: string, dto: RecordOpinionDto): Promise<OpinionWriteResponse> {
    const code = await this.lots.readableCode(me, text);
    const now = this.clock.now();
    const periodProblems: FieldProblem[] = [];
    if (dto.period.from > dto.period.to)
      periodProblems.push({ field: 'period.to', reason: 'must not be earlier than period.from' });
    if (dto.period.to > now.getUTCFullYear())
      periodProblems.push({
        field: 'period.to',
        reason: `must not be later than this year (${now.getUTCFullYear()})`,
      });
    if (periodProblems.length) throw AppError.validation(periodProblems);
    const body = plain<Omit<OpinionBody, 'nonce'>>(dto);
    if (body.adopts) await this.checkAdopted(me, code, body.adopts);
    const written = await this.ledger.withLots([code], async (tx) => {
      const state = tx.state(code);
      const lotId = (await this.reader.findLot(code, tx.manager))!.id;
      const asked = await this.requests.isAsked(me, lotId, tx.manager);
      // An asked assessor's opinion names the open request on the roll that asks them (core's
      // rules then admit it on an unlisted lot too) and answers it.
      const request = asked ? requestFor(state, me.id) : undefined;
      if (request !== undefined) body.request = request;
      if (asked && request === undefined && !mayAppend(state, 'opinion', me.id).allowed)
        throw new AppError(
          'roll_rule',
          'This lot is unlisted and its holder asked you before requests went on the roll: ask the holder to list it, or to ask you again, then record your opinion.',
        );
      requireMayAppend(state, 'opinion', me.id);
      await this.checkExhibits(tx, code, body.exhibits);
      await this.checkDailyLimit(tx, code, me.id, now);
      const entry = await tx.append(code, { kind: 'opinion', actor: me.id, body }, { fields: { body: '' } });
      if (asked && request === undefined) await this.requests.answer(tx.manager, lotId, me.id, entry.seq);
      return {
        entry,
        dissent: entry.state.dissents.some((d) => d.seq === entry.seq),
        holder: entry.state.holder,
        title: entry.state.description?.title ?? code,
      };
    });
    if (written.dissent)
      await this.tellHolder(written.holder, code, written.title, me.id, body as OpinionBody);
    return {
      seq: written.entry.seq,
      hash: written.entry.hash,
      dissent: written.dissent,
      opinions: await this.list(me, code),
    };
  }

  /** Withdraws one's own standing opinion (`opinion-withdrawn`); core admits only its author. */
  async withdraw(
    me: Writer,
    text: string,
    seq: number,
    dto: WithdrawOpinionDto,
  ): Promise<OpinionWriteResponse> {
    // Whoever may read the lot, even only up to a seq (an assessor who answered a request), may
    // withdraw their own opinion on it; core's rules decide the rest.
    const { code, upTo } = await this.lots.readAccess(me, text);
    const entry = await this.ledger.withLots([code], async (tx) => {
      const op = tx.state(code).opinions.find((o) => o.seq === seq && (upTo === null || seq <= upTo));
      if (!op) throw new AppError('not_found', `There is no standing opinion at seq ${seq} on this lot.`);
      if (op.author !== me.id) throw new AppError('forbidden', 'Only its author may withdraw an opinion.');
      return tx.append(code, {
        kind: 'opinion-withdrawn',
        actor: me.id,
        body: { opinionSeq: seq, ...(dto.note !== undefined ? { note: dto.note } : {}) },
      });
    });
    return { seq: entry.seq, hash: entry.hash, opinions: await this.list(me, code) };
  }

  /** The holder's answer to an opinion: a `note` whose `ref` is the opinion's seq. */
  async reply(me: Writer, text: string, seq: number, dto: ReplyDto): Promise<OpinionWriteResponse> {
    const code = await this.lots.readableCode(me, text);
    const entry = await this.ledger.withLots([code], async (tx) => {
      const state = tx.state(code);
      if (state.holder !== me.id)
        throw new AppError('forbidden', 'Only the holder answers opinions on a lot.');
      if (!state.opinions.some((o) => o.seq === seq))
        throw new AppError('not_found', `There is no standing opinion at seq ${seq} on this lot.`);
      return tx.append(
        code,
        { kind: 'note', actor: me.id, body: { text: dto.text, ref: seq } },
        {
          fields: { 'body.text': 'text' },
        },
      );
    });
    return { seq: entry.seq, hash: entry.hash, opinions: await this.list(me, code) };
  }

  /** The standing opinions of a lot with their roles, derived by core from the verified roll. */
  async list(viewer: Writer, text: string): Promise<LotOpinionsResponse> {
    const { code, lotId, upTo } = await this.lots.readAccess(viewer, text);
    const r = verifyRoll(await this.reader.entries(lotId, upTo === null ? {} : { limit: upTo + 1 }), {
      lot: code,
    });
    if (!r.ok)
      throw new AppError('internal', `the roll of ${code} does not verify at seq ${r.seq}: ${r.reason}`);
    const state = r.state;
    const withdrawn = upTo === null ? new Set<number>() : await this.withdrawnSince(lotId, upTo, viewer.id);
    const replies = new Map<number, OpinionView['replies']>();
    for (const e of r.verified) {
      if (e.header.kind !== 'note' || !e.body) continue;
      const note = e.body as NoteBody;
      if (note.ref === undefined) continue;
      replies.set(note.ref, [
        ...(replies.get(note.ref) ?? []),
        { seq: e.header.seq, author: e.header.actor, time: e.header.time, text: note.text },
      ]);
    }
    const opinions: OpinionView[] = state.opinions
      .filter((o) => !withdrawn.has(o.seq))
      .map((o) => {
        return {
          seq: o.seq,
          author: o.author,
          time: o.time,
          role: roleOf(state, o.seq),
          body: o.body,
          replies: replies.get(o.seq) ?? [],
        };
      });
    const ids = [
      state.holder,
      ...opinions.map((o) => o.author),
      ...opinions.flatMap((o) => o.replies.map((x) => x.author)),
    ];
    const cards: Record<string, PartyCard> = {};
    for (const [id, c] of await this.cards.cardsFor(ids)) cards[id] = partyCard(c);
    return {
      lot: code,
      holder: state.holder,
      listed: state.listed,
      attribution: state.attribution?.seq ?? null,
      dissents: state.dissents.map((d) => d.seq),
      opinions,
      cards,
    };
  }

  /**
   * The seqs of the viewer's own opinions they withdrew after `upTo`: a reader who sees the roll
   * only up to there still sees that their own opinion no longer stands, and nothing else after it.
   */
  private async withdrawnSince(lotId: string, upTo: number, viewer: string): Promise<Set<number>> {
    const later = await this.reader.entries(lotId, { fromSeq: upTo + 1, kinds: ['opinion-withdrawn'] });
    const seqs = new Set<number>();
    for (const e of later) {
      if (e.actor !== viewer) continue;
      const facts = (JSON.parse(e.header) as { facts?: { opinionSeq?: number } }).facts;
      const seq =
        facts?.opinionSeq ?? (e.body ? (JSON.parse(e.body) as OpinionWithdrawnBody).opinionSeq : null);
      if (typeof seq === 'number') seqs.add(seq);
    }
    return seqs;
  }

  /**
   * An adopted opinion must be a standing opinion with its body on this lot's roll or on an
   * ancestor's, as the viewer's bundle of this lot carries it (the same entries its pages show).
   */
  private async checkAdopted(me: Writer, code: string, ref: ParentRef): Promise<void> {
    const bundle = await this.lots.bundle(me, code);
    const found = bundle.rolls
      .find((r) => r.lot === ref.lot)
      ?.entries.find((e) => e.hash === ref.hash && e.body !== null);
    const header = found ? (JSON.parse(found.header) as EntryHeader) : null;
    let standing = false;
    if (header?.kind === 'opinion' && header.seq === ref.seq) {
      if (ref.lot === code) {
        const own = verifyRoll(bundle.rolls[0]!.entries, { lot: code });
        standing = own.ok && own.state.opinions.some((o) => o.seq === ref.seq && o.body !== null);
      } else {
        standing = inheritedRecord(bundle, code).some((i) => i.kind === 'opinion' && i.hash === ref.hash);
      }
    }
    if (!standing)
      throw AppError.validation([
        {
          field: 'adopts',
          reason: 'is not a standing opinion on this lot or on a lot its beads came from',
        },
      ]);
  }

  /** Every cited exhibit must be an `exhibit-added` entry on this lot's roll, named by its original's SHA-256. */
  private async checkExhibits(tx: RollTransaction, code: string, cited: string[]): Promise<void> {
    if (cited.length === 0) return;
    const bodies = await this.reader.bodiesOfKind(code, 'exhibit-added', tx.manager);
    const known = new Set<string>();
    for (const body of bodies) {
      const b = JSON.parse(body) as ExhibitAddedBody;
      if ('exhibit' in b) known.add(b.exhibit.original.sha256);
    }
    const problems = cited
      .map((sha, i) => ({ sha, i }))
      .filter(({ sha }) => !known.has(sha))
      .map(({ i }) => ({
        field: `exhibits.${i}`,
        reason: 'no exhibit with this SHA-256 is on this lot’s roll',
      }));
    if (problems.length) throw AppError.validation(problems);
  }

  /** At most `opinions.perDay` opinions by one author on one lot in any 24 hours. */
  private async checkDailyLimit(tx: RollTransaction, code: string, actor: string, now: Date): Promise<void> {
    const since = new Date(now.getTime() - DAY_MS).toISOString();
    const n = await this.reader.countSince(code, 'opinion', actor, since, tx.manager);
    const limit = this.config.opinions.perDay;
    if (n >= limit)
      throw new AppError(
        'rate_limited',
        `You have recorded ${limit} ${limit === 1 ? 'opinion' : 'opinions'} on this lot in the last 24 hours; please wait before recording another.`,
      );
  }

  private async tellHolder(
    holder: string,
    code: string,
    title: string,
    authorId: string,
    opinion: OpinionBody,
  ) {
    const [to, author] = await Promise.all([this.accounts.find(holder), this.accounts.find(authorId)]);
    if (!to) return;
    const url = `${this.config.publicBaseUrl}/lots/${code}`;
    await this.mail.send(
      to.email,
      opinionLetters.newDissent(
        to.displayName,
        { code, title },
        author?.displayName ?? 'Another account',
        opinion,
        url,
      ),
    );
  }
}
