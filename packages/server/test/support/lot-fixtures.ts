import { randomUUID } from 'node:crypto';
import type { LotDescription, OpinionBody } from '@beadroll/core';
import type { LedgerService } from '../../src/ledger/ledger.service';
import type { Viewer } from '../../src/lots/lots.service';
import type { TestAccount } from './accounts';

/** An invented dealer (only the id and role matter to the services). */
export function dealer(): Viewer {
  return { id: randomUUID(), role: 'dealer' };
}

/** A small valid description of an invented lot. */
export function description(over: Partial<LotDescription> = {}): LotDescription {
  return {
    title: 'Wound beads with pink roses',
    summary: 'Strand of white wound beads, each with three pink roses and green leaves.',
    form: 'strand',
    count: { value: 40, estimated: false },
    diameterMm: { min: 8, max: 10.5 },
    strandLengthMm: 610,
    colours: ['white', 'pink', 'green'],
    baseGlass: ['opaque'],
    decoration: ['roses'],
    listed: true,
    ...over,
  };
}

/** A valid opinion body, less its nonce: an attribution to Venice with a medium confidence. */
export function opinionDraft(over: Partial<Omit<OpinionBody, 'nonce'>> = {}): Omit<OpinionBody, 'nonce'> {
  return {
    origin: 'venice-murano',
    period: { from: 1880, to: 1920, approximate: true },
    technique: 'wound-lampwork',
    qualifier: 'attributed-to',
    confidence: 'medium',
    rationale: 'Raised roses over trailing, irregular holes.',
    exhibits: [],
    ...over,
  };
}

/** Registers a lot over HTTP as `who` with {@link description} changed by `over`; expects 201. */
export async function registerLot(
  who: TestAccount,
  over: Partial<LotDescription> = {},
  sealed?: object,
): Promise<{ code: string; displayCode: string }> {
  const res = await who.agent
    .post('/api/lots')
    .set('X-Beadroll-Request', '1')
    .send({ description: description(over), ...(sealed ? { sealed } : {}) })
    .expect(201);
  return res.body as { code: string; displayCode: string };
}

/** Records an opinion over HTTP as `who` ({@link opinionDraft} changed by `over`); expects 201. */
export async function recordOpinion(
  who: TestAccount,
  code: string,
  over: Partial<Omit<OpinionBody, 'nonce'>> = {},
): Promise<void> {
  await who.agent
    .post(`/api/lots/${code}/opinions`)
    .set('X-Beadroll-Request', '1')
    .send(opinionDraft(over))
    .expect(201);
}

/** Hands `code` from `from` to `to` over HTTP: an offer, then its acceptance; expects both to succeed. */
export async function handOver(from: TestAccount, code: string, to: TestAccount): Promise<void> {
  const offer = await from.agent
    .post('/api/transfers/offers')
    .set('X-Beadroll-Request', '1')
    .send({ lot: code, recipient: to.id })
    .expect(201);
  await to.agent
    .post(`/api/transfers/offers/${offer.body.offer.id}/accept`)
    .set('X-Beadroll-Request', '1')
    .send({})
    .expect(200);
}

/** Writes a `transfer-offered` entry straight through the ledger: `from` offers `code` to `to`. */
export function offerOnRoll(ledger: LedgerService, code: string, from: { id: string }, to: { id: string }) {
  return ledger.append(code, { kind: 'transfer-offered', actor: from.id, body: { recipient: to.id } });
}
