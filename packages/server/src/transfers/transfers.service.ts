import { Inject, Injectable, Logger, type OnModuleInit } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { formatLotCode, type Money } from '@beadroll/core';
import { DataSource, Repository } from 'typeorm';
import { DealerCardsService, type DealerCard } from '../accounts/dealer-cards.service';
import { partyCard, type PartyCard } from '../accounts/dto/dealer-card.dto';
import { AccountsService } from '../accounts/accounts.service';
import type { Account } from '../accounts/entities/account.entity';
import { RegistryService } from '../accounts/registry.service';
import type { Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import type { RollTransaction } from '../ledger/ledger.service';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { requireMayAppend } from '../ledger/roll-rule.error';
import { LotsService, type Viewer } from '../lots/lots.service';
import { MailService } from '../mail/mail.service';
import type { AnswerOfferDto, CreateOfferDto, ListOffersQueryDto } from './dto/transfer-requests.dto';
import type {
  CreateOfferResponse,
  InvitationResponse,
  OfferListResponse,
  OfferResponse,
} from './dto/transfer-responses.dto';
import { TransferInvitationEntity } from './entities/transfer-invitation.entity';
import { TransferOfferEntity, type OfferStatus } from './entities/transfer-offer.entity';
import { transferLetters, type LetterLot } from './transfer-letters';
import { LotViewsService } from '../lots/lot-views.service';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Core's field paths → request field names, for 400 answers. */
const FIELD_NAMES = { 'body.note': 'note', 'sealed.transfer-price': 'price' };

/** How each ending reads in a refusal. */
const ENDED: Record<Exclude<OfferStatus, 'open'>, string> = {
  accepted: 'was already accepted',
  declined: 'was already declined',
  withdrawn: 'was already withdrawn',
  lapsed: 'has lapsed',
};

export type Answer = 'accept' | 'decline' | 'withdraw';
const ANSWER_KIND = {
  accept: 'transfer-accepted',
  decline: 'transfer-declined',
  withdraw: 'transfer-withdrawn',
} as const;
const ANSWER_OUTCOME = { accept: 'accepted', decline: 'declined', withdraw: 'withdrawn' } as const;

function party(card: DealerCard | undefined): PartyCard | null {
  return card ? partyCard(card) : null;
}

/**
 * Transfers between dealers: offers (to a verified dealer, or an invitation to an e-mail
 * address), their answers, and the dealers' lists. Every roll write goes through the ledger's
 * append path, one transaction each, under the lot's row lock: of several answers to one offer
 * exactly one finds it open, the others get `offer_closed`.
 */
@Injectable()
export class TransfersService implements OnModuleInit {
  private readonly logger = new Logger('transfers');

  constructor(
    private readonly views: LotViewsService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly dataSource: DataSource,
    private readonly ledger: LedgerService,
    private readonly reader: RollReaderService,
    private readonly lots: LotsService,
    private readonly cards: DealerCardsService,
    private readonly mail: MailService,
    private readonly registry: RegistryService,
    private readonly accounts: AccountsService,
    @InjectRepository(TransferOfferEntity) private readonly offers: Repository<TransferOfferEntity>,
    @InjectRepository(TransferInvitationEntity)
    private readonly invitations: Repository<TransferInvitationEntity>,
  ) {}

  onModuleInit(): void {
    // A former holder reads the roll up to the entry that handed the lot on.
    this.lots.addReadGrant({
      upTo: async (viewer, lotId) => {
        const rows: Array<{ upto: number | null }> = await this.dataSource.query(
          `SELECT max("answer_seq") AS "upto" FROM "transfer_offers"
           WHERE "lot_id" = $1 AND "offerer" = $2 AND "status" = 'accepted'`,
          [lotId, viewer.id],
        );
        return rows[0]?.upto ?? null;
      },
    });
    this.registry.onApproved((account) => this.offerInvitationsFor(account));
  }

  /** Verified dealers other than the viewer whose name, handle or business contains `q`. */
  async searchDealers(me: Viewer, q: string): Promise<PartyCard[]> {
    const rows = await this.accounts.searchDealers(q, me.id, 10);
    const cards = await this.cards.cardsFor(rows.map((r) => r.id));
    return rows.map((r) => party(cards.get(r.id))).filter((p): p is PartyCard => p !== null);
  }

  /** Offers a lot to a verified dealer, or records an invitation for an address without one. */
  async offer(me: Principal, dto: CreateOfferDto): Promise<CreateOfferResponse> {
    const code = this.lotField(dto.lot);
    if (dto.recipient !== undefined && dto.email !== undefined) {
      throw AppError.validation([
        { field: 'recipient', reason: 'choose a dealer or type an e-mail address, not both' },
      ]);
    }
    const price = dto.price ? { amount: dto.price.amount, currency: dto.price.currency } : undefined;
    let recipient: Account | null = null;
    if (dto.email !== undefined) {
      const found = await this.accounts.findByEmail(dto.email);
      if (found?.id === me.id)
        throw AppError.validation([{ field: 'email', reason: 'that is your own address' }]);
      if (!found || (found.role === 'dealer' && found.status === 'pending')) {
        return {
          made: 'invitation',
          invitation: await this.invite(me, code, dto.email, found, dto.note, price),
        };
      }
      this.checkRecipient(found, 'email');
      recipient = found;
    } else {
      const id = dto.recipient!;
      if (id === me.id)
        throw AppError.validation([{ field: 'recipient', reason: 'you cannot offer a lot to yourself' }]);
      recipient = await this.accounts.find(id);
      this.checkRecipient(recipient, 'recipient');
    }
    await this.lots.readableCode(me, code);
    const row = await this.ledger.withLots([code], (tx) =>
      this.writeOffer(tx, me.id, code, recipient!.id, dto.note, price),
    );
    await this.mailOfferMade(row);
    return { made: 'offer', offer: await this.toResponse(row, me.id) };
  }

  /** One offer for one of its two dealers (anyone else: not found). */
  async get(me: Viewer, id: string): Promise<OfferResponse> {
    return this.toResponse(await this.partyRow(me, id), me.id);
  }

  /** Accepts, declines or withdraws an open offer. */
  async answer(me: Principal, id: string, answer: Answer, dto: AnswerOfferDto): Promise<OfferResponse> {
    const row = await this.partyRow(me, id);
    const mine = answer === 'withdraw' ? row.offerer : row.recipient;
    if (mine !== me.id) {
      throw new AppError(
        'forbidden',
        answer === 'withdraw'
          ? 'Only the dealer who made the offer can withdraw it.'
          : `Only the dealer the offer was made to can ${answer} it.`,
      );
    }
    await this.ledger.withLots([row.code], async (tx) => {
      await this.requireOpen(tx, row);
      await tx.append(
        row.code,
        {
          kind: ANSWER_KIND[answer],
          actor: me.id,
          body: { offerSeq: row.offerSeq, ...(dto.note !== undefined ? { note: dto.note } : {}) },
        },
        { fields: FIELD_NAMES },
      );
    });
    const done = (await this.offers.findOne({ where: { id: row.id } }))!;
    await this.mailOfferEnded(done, ANSWER_OUTCOME[answer]);
    return this.toResponse(done, me.id);
  }

  /** The viewer's incoming or outgoing offers, newest first. */
  async list(me: Viewer, q: ListOffersQueryDto): Promise<OfferListResponse> {
    const page = q.page ?? 1;
    const pageSize = q.pageSize ?? 20;
    const where = q.box === 'incoming' ? { recipient: me.id } : { offerer: me.id };
    const code = q.lot === undefined ? undefined : RollReaderService.canonicalCode(q.lot);
    if (code === null)
      throw AppError.validation([{ field: 'lot', reason: 'lot must be a lot code such as 7K2Q-M9XA-T' }]);
    const [rows, total] = await this.offers.findAndCount({
      where: { ...where, ...(q.status ? { status: q.status } : {}), ...(code ? { code } : {}) },
      order: { offeredAt: 'DESC', id: 'ASC' },
      skip: (page - 1) * pageSize,
      take: pageSize,
    });
    const cards = await this.cards.cardsFor(rows.flatMap((r) => [r.offerer, r.recipient ?? '']));
    const prices = await this.prices(rows, me.id);
    return {
      items: rows.map((r) => this.toResponseWith(r, me.id, cards, prices.get(r.id))),
      total,
      page,
      pageSize,
    };
  }

  /** The viewer's invitations, newest first. */
  async listInvitations(me: Viewer): Promise<InvitationResponse[]> {
    const rows = await this.invitations.find({
      where: { inviter: me.id },
      order: { createdAt: 'DESC' },
      take: 200,
    });
    return Promise.all(rows.map((r) => this.toInvitation(r)));
  }

  /** Turns a stalled (or waiting) invitation into an offer once the invitee is a verified dealer. */
  async offerInvitation(me: Principal, id: string): Promise<InvitationResponse> {
    const inv = await this.ownInvitation(me, id);
    if (inv.status === 'offered' || inv.status === 'cancelled')
      throw new AppError('conflict', `This invitation was already ${inv.status}.`);
    const invitee = await this.accounts.findByEmail(inv.email);
    if (!invitee || invitee.role !== 'dealer' || invitee.status !== 'verified') {
      throw new AppError(
        'conflict',
        'The invited dealer has no verified account yet; the offer is made as soon as the registrar verifies it.',
      );
    }
    const made = await this.convert(inv, invitee);
    if (!made) throw new AppError('roll_rule', inv.statusReason ?? 'The offer could not be made.');
    return this.toInvitation(inv);
  }

  async cancelInvitation(me: Viewer, id: string): Promise<InvitationResponse> {
    const inv = await this.ownInvitation(me, id);
    if (inv.status === 'offered' || inv.status === 'cancelled')
      throw new AppError('conflict', `This invitation was already ${inv.status}.`);
    inv.status = 'cancelled';
    inv.statusReason = null;
    await this.invitations.save(inv);
    return this.toInvitation(inv);
  }

  /** Writes `transfer-offered` in a transaction holding the lot; returns the new list row. */
  async writeOffer(
    tx: RollTransaction,
    offerer: string,
    code: string,
    recipient: string,
    note: string | undefined,
    price: Money | undefined,
  ): Promise<TransferOfferEntity> {
    const state = tx.state(code);
    requireMayAppend(state, 'transfer-offered', offerer);
    const e = await tx.append(
      code,
      {
        kind: 'transfer-offered',
        actor: offerer,
        body: { recipient, ...(note !== undefined ? { note } : {}) },
        ...(price
          ? { sealed: { 'transfer-price': price }, sealedAlsoVisibleTo: { 'transfer-price': [recipient] } }
          : {}),
      },
      { fields: FIELD_NAMES },
    );
    return (await tx.manager.findOne(TransferOfferEntity, {
      where: { code: e.lot, offerSeq: e.seq },
    }))!;
  }

  /** Fails with `offer_closed` unless the row's offer is the lot's open offer. */
  async requireOpen(tx: RollTransaction, row: TransferOfferEntity): Promise<void> {
    const open = tx.state(row.code).openOffer;
    if (open?.seq === row.offerSeq) return;
    const now = await tx.manager.findOne(TransferOfferEntity, { where: { id: row.id } });
    const why = now && now.status !== 'open' ? ENDED[now.status] : 'is no longer open';
    throw new AppError('offer_closed', `This offer ${why}; nothing was changed.`);
  }

  // --- e-mail ------------------------------------------------------------------------------

  async mailOfferMade(row: TransferOfferEntity): Promise<void> {
    const [offerer, recipient] = await this.pair(row);
    const lot = this.letterLot(row);
    const url = this.offerUrl(row.id);
    if (recipient)
      await this.mail.send(
        recipient.email,
        transferLetters.offerReceived(
          recipient.displayName,
          this.name(offerer),
          lot,
          url,
          row.note ?? undefined,
        ),
      );
    if (offerer)
      await this.mail.send(
        offerer.email,
        transferLetters.offerSent(offerer.displayName, this.name(recipient), lot, url),
      );
  }

  async mailOfferEnded(row: TransferOfferEntity, outcome: Exclude<OfferStatus, 'open'>): Promise<void> {
    const [offerer, recipient] = await this.pair(row);
    const who = { offerer: this.name(offerer), recipient: this.name(recipient) };
    const url = `${this.config.publicBaseUrl}/lots/${row.code}`;
    for (const a of [offerer, recipient]) {
      // A closed account's address is gone; it gets no letter.
      if (!a || a.status === 'closed') continue;
      await this.mail.send(
        a.email,
        transferLetters.offerEnded(
          a.displayName,
          outcome,
          who,
          this.letterLot(row),
          url,
          row.answerNote ?? undefined,
        ),
      );
    }
  }

  // --- invitations -------------------------------------------------------------------------

  private async invite(
    me: Principal,
    code: string,
    email: string,
    existing: Account | null,
    note: string | undefined,
    price: Money | undefined,
  ): Promise<InvitationResponse> {
    await this.lots.readableCode(me, code);
    const lot = (await this.reader.findLot(code))!;
    // Who holds the lot is read from its roll (replayed under the lot's lock), never the cached copy.
    const state = await this.ledger.withLots([code], async (tx) => tx.state(code));
    requireMayAppend(state, 'transfer-offered', me.id);
    const dup = await this.invitations
      .createQueryBuilder('i')
      .where(`i.lotId = :lot AND i.status = 'waiting' AND lower(i.email) = lower(:email)`, {
        lot: lot.id,
        email,
      })
      .getOne();
    if (dup) throw new AppError('conflict', 'You have already invited this address to take this lot.');
    const inv = await this.invitations.save(
      this.invitations.create({
        lotId: lot.id,
        code,
        inviter: me.id,
        email,
        note: note ?? null,
        price: price ?? null,
        status: 'waiting',
        statusReason: null,
        invitee: existing?.id ?? null,
        offerSeq: null,
      }),
    );
    const inviter = (await this.accounts.find(me.id))!;
    const title = state.description?.title ?? '';
    await this.mail.send(
      email,
      transferLetters.invitation(
        inviter.displayName,
        inviter.business,
        { code, title },
        `${this.config.publicBaseUrl}/sign-up?${new URLSearchParams({ email })}`,
        existing !== null,
      ),
    );
    return this.toInvitation(inv);
  }

  /** Called when the registrar verifies an account: its waiting invitations become offers. */
  private async offerInvitationsFor(account: Account): Promise<void> {
    if (account.role !== 'dealer') return;
    const waiting = await this.invitations
      .createQueryBuilder('i')
      .where(`i.status = 'waiting' AND lower(i.email) = lower(:email)`, { email: account.email })
      .orderBy('i.createdAt', 'ASC')
      .getMany();
    for (const inv of waiting) await this.convert(inv, account);
  }

  /** Makes the offer of an invitation; a refusal leaves it `stalled` with the reason. */
  private async convert(inv: TransferInvitationEntity, invitee: Account): Promise<boolean> {
    inv.invitee = invitee.id;
    try {
      const inviter = await this.accounts.find(inv.inviter);
      if (!inviter || inviter.status !== 'verified')
        throw new AppError('forbidden', 'your account may not write to rolls at the moment.');
      const row = await this.ledger.withLots([inv.code], async (tx) => {
        const r = await this.writeOffer(
          tx,
          inv.inviter,
          inv.code,
          invitee.id,
          inv.note ?? undefined,
          inv.price ?? undefined,
        );
        inv.status = 'offered';
        inv.statusReason = null;
        inv.offerSeq = r.offerSeq;
        await tx.manager.save(inv);
        return r;
      });
      await this.mailOfferMade(row);
      return true;
    } catch (e) {
      if (!(e instanceof AppError)) this.logger.error(`invitation ${inv.id}: ${(e as Error).message}`);
      const reason = e instanceof AppError ? e.message : 'an unexpected error.';
      inv.status = 'stalled';
      inv.statusReason = reason.slice(0, 500);
      await this.invitations.save(inv);
      const inviter = await this.accounts.find(inv.inviter);
      if (inviter) {
        const title = (await this.views.find({ lotId: inv.lotId }))?.title ?? '';
        await this.mail.send(
          inviter.email,
          transferLetters.invitationStalled(
            inviter.displayName,
            { code: inv.code, title },
            reason,
            `${this.config.publicBaseUrl}/transfers/outgoing`,
          ),
        );
      }
      return false;
    }
  }

  private async ownInvitation(me: Viewer, id: string): Promise<TransferInvitationEntity> {
    const inv = UUID.test(id) ? await this.invitations.findOne({ where: { id } }) : null;
    if (!inv || inv.inviter !== me.id) throw new AppError('not_found', 'Not found.');
    return inv;
  }

  private async toInvitation(inv: TransferInvitationEntity): Promise<InvitationResponse> {
    const view = await this.views.find({ lotId: inv.lotId });
    const offer =
      inv.offerSeq !== null
        ? await this.offers.findOne({ where: { lotId: inv.lotId, offerSeq: inv.offerSeq } })
        : null;
    return {
      id: inv.id,
      lot: { code: inv.code, displayCode: formatLotCode(inv.code), title: view?.title ?? '' },
      email: inv.email,
      status: inv.status,
      ...(inv.statusReason ? { statusReason: inv.statusReason } : {}),
      ...(inv.note ? { note: inv.note } : {}),
      ...(inv.price ? { price: inv.price } : {}),
      ...(offer ? { offerId: offer.id } : {}),
      createdAt: new Date(inv.createdAt).toISOString(),
    };
  }

  // --- helpers -----------------------------------------------------------------------------

  private lotField(text: string): string {
    const code = RollReaderService.canonicalCode(text);
    if (!code)
      throw AppError.validation([{ field: 'lot', reason: 'lot must be a lot code such as 7K2Q-M9XA-T' }]);
    return code;
  }

  private checkRecipient(a: Account | null, field: string): asserts a is Account {
    const say = (reason: string) => AppError.validation([{ field, reason }]);
    if (!a || a.role !== 'dealer') throw say('no dealer account has that name or address');
    if (a.status === 'suspended') throw say('that dealer’s account is suspended and cannot take offers');
    if (a.status !== 'verified')
      throw say('that dealer’s account is not verified by the registrar, so it cannot take offers yet');
  }

  private async partyRow(me: Viewer, id: string): Promise<TransferOfferEntity> {
    const row = UUID.test(id) ? await this.offers.findOne({ where: { id } }) : null;
    if (!row || (row.offerer !== me.id && row.recipient !== me.id))
      throw new AppError('not_found', 'Not found.');
    return row;
  }

  private async pair(row: TransferOfferEntity): Promise<[Account | undefined, Account | undefined]> {
    const ids = [row.offerer, row.recipient].filter((x): x is string => !!x && UUID.test(x));
    const found = await this.accounts.findMany(ids);
    return [found.find((a) => a.id === row.offerer), found.find((a) => a.id === row.recipient)];
  }

  private name(a: Account | undefined): string {
    return a ? `${a.displayName} (${a.business})` : 'a dealer';
  }

  private letterLot(row: TransferOfferEntity): LetterLot {
    return { code: row.code, title: row.title };
  }

  private offerUrl(id: string): string {
    return `${this.config.publicBaseUrl}/transfers/offers/${id}`;
  }

  /** Sealed transfer prices the viewer may read, by offer row id. */
  private async prices(rows: TransferOfferEntity[], viewer: string): Promise<Map<string, Money>> {
    const out = new Map<string, Money>();
    if (!rows.length) return out;
    const at = rows.map((r) => ({ lotId: r.lotId, seq: r.offerSeq }));
    for (const f of await this.reader.sealedAt(at, viewer, ['transfer-price'])) {
      const row = rows.find((r) => r.lotId === f.lotId && r.offerSeq === f.seq);
      if (row) out.set(row.id, f.value as Money);
    }
    return out;
  }

  private async toResponse(row: TransferOfferEntity, viewer: string): Promise<OfferResponse> {
    const cards = await this.cards.cardsFor([row.offerer, row.recipient ?? '']);
    return this.toResponseWith(row, viewer, cards, (await this.prices([row], viewer)).get(row.id));
  }

  private toResponseWith(
    r: TransferOfferEntity,
    viewer: string,
    cards: Map<string, DealerCard>,
    price: Money | undefined,
  ): OfferResponse {
    const offeredAt = new Date(r.offeredAt);
    return {
      id: r.id,
      lot: { code: r.code, displayCode: formatLotCode(r.code), title: r.title },
      offerSeq: r.offerSeq,
      status: r.status,
      offerer: party(cards.get(r.offerer)),
      recipient: party(r.recipient ? cards.get(r.recipient) : undefined),
      viewerIs: r.offerer === viewer ? 'offerer' : 'recipient',
      ...(r.note ? { note: r.note } : {}),
      offeredAt: offeredAt.toISOString(),
      ...(r.status === 'open'
        ? {
            lapsesAt: new Date(
              offeredAt.getTime() + this.config.transfers.lapseDays * 86_400_000,
            ).toISOString(),
          }
        : {}),
      ...(r.answeredAt ? { answeredAt: new Date(r.answeredAt).toISOString() } : {}),
      ...(r.answerSeq !== null ? { answerSeq: r.answerSeq } : {}),
      ...(r.answerNote ? { answerNote: r.answerNote } : {}),
      ...(price ? { price } : {}),
    };
  }
}
