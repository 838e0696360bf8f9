import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, IsNull, Not, Repository, type EntityManager } from 'typeorm';
import { AppError } from '../common/app-error';
import { DealerCard } from './dto/dealer-card.dto';
import { Account } from './entities/account.entity';

export { DealerCard };

function toCard(a: Account): DealerCard | null {
  if (!a.verifiedAt) return null;
  const status = a.status === 'verified' ? 'verified' : a.status === 'suspended' ? 'suspended' : 'former';
  return {
    id: a.id,
    handle: a.handle,
    displayName: a.displayName,
    business: a.business,
    town: a.town,
    country: a.country,
    verifiedSince: a.verifiedAt.toISOString(),
    status,
    role: a.role,
  };
}

/** Public cards of verified accounts (dealers and assessors), for the dealer page and public lot pages. */
@Injectable()
export class DealerCardsService {
  constructor(@InjectRepository(Account) private readonly accounts: Repository<Account>) {}

  /** Cards for the given account ids; ids of accounts never verified (or unknown) are left out. */
  async cardsFor(ids: string[], manager?: EntityManager): Promise<Map<string, DealerCard>> {
    const unique = [...new Set(ids)].filter((id) => /^[0-9a-f-]{36}$/i.test(id));
    const out = new Map<string, DealerCard>();
    if (!unique.length) return out;
    const accounts = manager ? manager.getRepository(Account) : this.accounts;
    const rows = await accounts.find({ where: { id: In(unique), verifiedAt: Not(IsNull()) } });
    for (const row of rows) {
      const card = toCard(row);
      if (card) out.set(row.id, card);
    }
    return out;
  }

  /** The card for a handle; anything not ever verified is the same bare not-found. */
  async byHandle(handle: string): Promise<DealerCard> {
    const row = /^[a-z0-9-]{1,32}$/.test(handle) ? await this.accounts.findOne({ where: { handle } }) : null;
    const card = row && row.role !== 'registrar' ? toCard(row) : null;
    if (!card) throw new AppError('not_found', 'Not found.');
    return card;
  }
}
