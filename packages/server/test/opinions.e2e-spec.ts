import type { ExhibitFile, OpinionBody } from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { FakeSmtpService } from '../src/mail/fake-smtp.service';
import { LedgerService } from '../src/ledger/ledger.service';
import { createAccount, type TestAccount, useAccount } from './support/accounts';
import { description, handOver, opinionDraft } from './support/lot-fixtures';
import { useTestApp } from './support/test-app';

type Draft = Omit<OpinionBody, 'nonce'>;

const opinion = opinionDraft;

const CSRF = ['X-Beadroll-Request', '1'] as const;

describe('opinions, dissent and the attribution aid over HTTP', () => {
  let db: DataSource;

  const t = useTestApp();
  const holder = useAccount(t, { role: 'dealer', displayName: 'Mirela Holt' });
  const other = useAccount(t, { role: 'dealer', displayName: 'Osric Venn' });
  const assessor = useAccount(t, { role: 'assessor', displayName: 'Thea Quill' });
  const third = useAccount(t, { role: 'dealer' });
  beforeAll(async () => {
    db = t.app.get(DataSource);
  });

  async function newLot(listed = true, by: TestAccount = holder): Promise<string> {
    const res = await by.agent
      .post('/api/lots')
      .set(...CSRF)
      .send({ description: description({ listed }) })
      .expect(201);
    return res.body.code as string;
  }

  function post(who: TestAccount, code: string, body: unknown) {
    return who.agent
      .post(`/api/lots/${code}/opinions`)
      .set(...CSRF)
      .send(body as object);
  }

  async function headSeq(code: string): Promise<number> {
    const rows = (await db.query('SELECT "head_seq" FROM "lots" WHERE "code" = $1', [code])) as Array<{
      head_seq: number;
    }>;
    return rows[0]!.head_seq;
  }

  async function roles(code: string): Promise<Record<number, string>> {
    const res = await holder.agent.get(`/api/lots/${code}/opinions`).expect(200);
    return Object.fromEntries(
      (res.body.opinions as Array<{ seq: number; role: string }>).map((o) => [o.seq, o.role]),
    );
  }

  // The dissent rules of the ledger format (docs/ledger-format.md §9.3), each case read back
  // through the API from core's reducer: a different origin where neither is "unknown", or
  // periods that do not overlap; shared end years overlap; the approximate flag never widens.
  const DISSENT_CASES: Array<{
    desc: string;
    holder?: Partial<Draft>;
    other: Partial<Draft>;
    dissent: boolean;
  }> = [
    {
      desc: 'same origin, overlapping periods',
      holder: {},
      other: { period: { from: 1900, to: 1930, approximate: false } },
      dissent: false,
    },
    { desc: 'a different known origin', holder: {}, other: { origin: 'india' }, dissent: true },
    { desc: 'the other says unknown', holder: {}, other: { origin: 'unknown' }, dissent: false },
    {
      desc: 'the holder says unknown',
      holder: { origin: 'unknown' },
      other: { origin: 'china' },
      dissent: false,
    },
    {
      desc: 'free-text origin "other" against a region',
      holder: {},
      other: { origin: 'other', originNote: 'Bavaria' },
      dissent: true,
    },
    {
      desc: 'same origin, periods apart',
      holder: {},
      other: { period: { from: 1950, to: 1990, approximate: false } },
      dissent: true,
    },
    {
      desc: 'periods sharing an end year overlap',
      holder: { period: { from: 1850, to: 1900, approximate: false } },
      other: { period: { from: 1900, to: 1950, approximate: false } },
      dissent: false,
    },
    {
      desc: 'the approximate flag does not widen a range',
      holder: { period: { from: 1850, to: 1899, approximate: true } },
      other: { period: { from: 1900, to: 1950, approximate: true } },
      dissent: true,
    },
    {
      desc: 'unknown origin but periods apart',
      holder: {},
      other: { origin: 'unknown', period: { from: 1700, to: 1750, approximate: false } },
      dissent: true,
    },
    { desc: 'no holder opinion: no attribution, no dissent', other: { origin: 'japan' }, dissent: false },
  ];

  it.each(DISSENT_CASES)('dissent rules: $desc', async (c) => {
    const code = await newLot();
    if (c.holder) await post(holder, code, opinion(c.holder)).expect(201);
    const res = await post(other, code, opinion(c.other)).expect(201);
    expect(res.body.dissent).toBe(c.dissent);
    const list = res.body.opinions;
    expect(list.dissents).toEqual(c.dissent ? [res.body.seq] : []);
    if (!c.holder) expect(list.attribution).toBeNull();
    else expect(list.attribution).toBe(res.body.seq - 1);
  });

  it('dissent rules: the holder’s newest standing opinion is the attribution; withdrawing it changes the dissents', async () => {
    const code = await newLot();
    const first = (await post(holder, code, opinion()).expect(201)).body.seq as number;
    const theirs = (await post(assessor, code, opinion()).expect(201)).body.seq as number;
    expect((await roles(code))[theirs]).toBe('other');
    const second = (await post(holder, code, opinion({ origin: 'bohemia-czech' })).expect(201)).body
      .seq as number;
    expect(await roles(code)).toEqual({ [first]: 'other', [theirs]: 'dissent', [second]: 'attribution' });
    await holder.agent
      .post(`/api/lots/${code}/opinions/${second}/withdrawal`)
      .set(...CSRF)
      .send({ note: 'Second thoughts.' })
      .expect(200);
    expect(await roles(code)).toEqual({ [first]: 'attribution', [theirs]: 'other' });
  });

  it('dissent rules: after a transfer the earlier holder’s opinion is an ordinary one and can dissent', async () => {
    const code = await newLot();
    const old = (await post(holder, code, opinion()).expect(201)).body.seq as number;
    await handOver(holder, code, other);
    let list = (await other.agent.get(`/api/lots/${code}/opinions`).expect(200)).body;
    expect(list.holder).toBe(other.id);
    expect(list.attribution).toBeNull();
    expect(list.dissents).toEqual([]);
    const mine = (
      await post(
        other,
        code,
        opinion({ origin: 'india', period: { from: 1990, to: 2010, approximate: false } }),
      ).expect(201)
    ).body;
    list = mine.opinions;
    expect(list.attribution).toBe(mine.seq);
    expect(list.dissents).toEqual([old]);
  });

  it('e-mails the holder on a new dissent, not on a concurring opinion', async () => {
    const code = await newLot();
    await post(holder, code, opinion()).expect(201);
    const fake = t.app.get(FakeSmtpService);
    const before = fake.to(holder.email).length;
    await post(third, code, opinion({ period: { from: 1890, to: 1910, approximate: false } })).expect(201);
    expect(fake.to(holder.email).length).toBe(before);
    await post(
      assessor,
      code,
      opinion({ origin: 'india', period: { from: 1980, to: 2020, approximate: true } }),
    ).expect(201);
    const mails = fake.to(holder.email);
    expect(mails.length).toBe(before + 1);
    expect(mails[0]!.subject).toMatch(/^A dissent on your lot /);
    expect(mails[0]!.text).toContain('Thea Quill');
    expect(mails[0]!.text).toContain('India, about 1980–2020');
    expect(mails[0]!.text).toContain(`http://beadroll.example/lots/${code}`);
  });

  it('the holder answers an opinion with a note that refers to it; nobody else may', async () => {
    const code = await newLot();
    await post(holder, code, opinion()).expect(201);
    const seq = (await post(assessor, code, opinion({ origin: 'china' })).expect(201)).body.seq as number;
    await other.agent
      .post(`/api/lots/${code}/opinions/${seq}/replies`)
      .set(...CSRF)
      .send({ text: 'Not mine to answer.' })
      .expect(403);
    await holder.agent
      .post(`/api/lots/${code}/opinions/${seq}/replies`)
      .set(...CSRF)
      .send({ text: '' })
      .expect(400);
    const res = await holder.agent
      .post(`/api/lots/${code}/opinions/${seq}/replies`)
      .set(...CSRF)
      .send({ text: 'The holes were reamed by a later owner.' })
      .expect(201);
    const view = (res.body.opinions.opinions as Array<{ seq: number; replies: unknown[] }>).find(
      (o) => o.seq === seq,
    )!;
    expect(view.replies).toEqual([
      expect.objectContaining({
        seq: res.body.seq,
        author: holder.id,
        text: 'The holes were reamed by a later owner.',
      }),
    ]);
    const roll = (await holder.agent.get(`/api/lots/${code}/roll`).expect(200)).body;
    expect(JSON.parse(roll.entries[res.body.seq].body)).toMatchObject({ ref: seq });
  });

  it('withdrawal: only by the author, only of a standing opinion', async () => {
    const code = await newLot();
    const seq = (await post(other, code, opinion()).expect(201)).body.seq as number;
    const withdraw = (who: TestAccount, which: number | string, status: number) =>
      who.agent
        .post(`/api/lots/${code}/opinions/${which}/withdrawal`)
        .set(...CSRF)
        .send({})
        .expect(status);
    await withdraw(holder, seq, 403);
    await withdraw(other, 0, 404);
    await withdraw(other, 'x', 400);
    await withdraw(other, seq, 200);
    // Once withdrawn, it is no longer standing.
    await withdraw(other, seq, 404);
    expect((await roles(code))[seq]).toBeUndefined();
  });

  describe('bad input: a clear 4xx and nothing written', () => {
    let code: string;
    beforeAll(async () => {
      code = await newLot();
    });

    it.each([
      ['a reversed year range', 'period.to', { period: { from: 1900, to: 1850, approximate: false } }],
      ['a range ending in the future', 'period.to', { period: { from: 1990, to: 9000, approximate: false } }],
      ['a year outside the format', 'period.from', { period: { from: -6000, to: 1850, approximate: false } }],
      ['a fractional year', 'period.from', { period: { from: 1850.5, to: 1900, approximate: false } }],
      ['an origin the trade does not use', 'origin', { origin: 'atlantis' }],
      ['an unknown qualifier', 'qualifier', { qualifier: 'certainly' }],
      ['a rationale over 5,000 characters', 'rationale', { rationale: 'x'.repeat(5001) }],
      ['a malformed exhibit reference', 'exhibits', { exhibits: ['not-a-hash'] }],
      ['an unknown exhibit', 'exhibits.0', { exhibits: ['a'.repeat(64)] }],
      ['an unknown field', 'price', { price: 100 }],
    ])('%s → 400 naming %s', async (_desc, field, over) => {
      const before = await headSeq(code);
      const res = await post(other, code, { ...opinion(), ...over }).expect(400);
      expect(res.body.error.code).toBe('validation');
      expect(res.body.error.fields.map((f: { field: string }) => f.field)).toContain(field);
      expect(await headSeq(code)).toBe(before);
    });

    it('a missing field → 400 naming it', async () => {
      const { rationale: _r, ...rest } = opinion();
      const res = await post(other, code, rest).expect(400);
      expect(res.body.error.fields.map((f: { field: string }) => f.field)).toContain('rationale');
    });

    it('an exhibit on this lot’s roll can be cited; one on another lot cannot', async () => {
      const file: ExhibitFile = { sha256: 'b'.repeat(64), size: 1234, mediaType: 'image/jpeg' };
      // The exhibit is put on the roll through the ledger's append path (as the exhibits feature does).
      await t.app.get(LedgerService).append(code, {
        kind: 'exhibit-added',
        actor: other.id,
        body: { exhibit: { kind: 'hole', original: file, derivatives: [] } },
      });
      const elsewhere = await newLot();
      await post(other, elsewhere, opinion({ exhibits: [file.sha256] })).expect(400);
      const res = await post(other, code, opinion({ exhibits: [file.sha256] })).expect(201);
      const roll = (await other.agent.get(`/api/lots/${code}/roll`).expect(200)).body;
      expect(JSON.parse(roll.entries[res.body.seq].body).exhibits).toEqual([file.sha256]);
    });

    it('an unlisted lot: its holder may, anyone else is refused (the lot is not even readable)', async () => {
      const unlisted = await newLot(false);
      const res = await post(other, unlisted, opinion()).expect(404);
      expect(res.body.error.code).toBe('not_found');
      await post(assessor, unlisted, opinion()).expect(404);
      expect(await headSeq(unlisted)).toBe(0);
      await post(holder, unlisted, opinion()).expect(201);
    });

    it('accounts not verified, suspended or of the wrong role are refused', async () => {
      const before = await headSeq(code);
      const pending = await createAccount(t, { role: 'dealer', status: 'pending' });
      expect((await post(pending, code, opinion()).expect(403)).body.error.code).toBe('not_verified');
      const pendingAssessor = await createAccount(t, { role: 'assessor', status: 'pending' });
      await post(pendingAssessor, code, opinion()).expect(403);
      const suspended = await createAccount(t, { role: 'assessor', status: 'suspended' });
      await post(suspended, code, opinion()).expect(403);
      const registrar = await createAccount(t, { role: 'registrar' });
      expect((await post(registrar, code, opinion()).expect(403)).body.error.code).toBe('forbidden');
      expect(await headSeq(code)).toBe(before);
    });

    it('too many opinions by one author on one lot in a day → 429, nothing written', async () => {
      const lot = await newLot();
      for (let i = 0; i < 3; i++) await post(assessor, lot, opinion()).expect(201);
      const before = await headSeq(lot);
      const res = await post(assessor, lot, opinion()).expect(429);
      expect(res.body.error.code).toBe('rate_limited');
      expect(await headSeq(lot)).toBe(before);
      // Another author, or the same author on another lot, is not held back.
      await post(other, lot, opinion()).expect(201);
      await post(assessor, await newLot(), opinion()).expect(201);
    });

    it('an unknown lot → the same 404', async () => {
      await post(other, 'ZZZZZZZZZ', opinion()).expect(404);
    });
  });

  describe('POST /api/attribution-aid', () => {
    function aid(body: unknown) {
      return request(t.app.getHttpServer())
        .post('/api/attribution-aid')
        .set(...CSRF)
        .send(body as object);
    }

    it('powder in the hole yields the mandrel-and-release indication, pointing to India and China', async () => {
      // "Tornado Beads Redux and Musings on Cleaning Beads" (fourtailslampwork.blogspot.com, 2008):
      // bead release sticks in the hole of a mandrel-wound bead; "Torch bead process" (D'source,
      // Purdilnagar): Indian beadmakers wind on wire coated with clay paste.
      const res = await aid({ observations: { hole: 'powder' } }).expect(200);
      const rules = res.body.indications.flatMap((i: { reasons: Array<{ rule: string }> }) =>
        i.reasons.map((r) => r.rule),
      );
      expect(rules).toContain('hole-powder-release');
      const origins = res.body.indications
        .filter((i: { origin?: string }) => i.origin)
        .map((i: { origin: string }) => i.origin);
      expect(origins.slice(0, 2).sort()).toEqual(['china', 'india']);
      expect(res.body.disclaimer).toMatch(/aid, not an authentication/);
    });

    it('a clean hole points weakly to copper-wire work and brings the acid-as-history caution', async () => {
      // "Glossary – W" (faktorinc.com): Italians wind on copper wire and etch it out; "Tornado
      // Beads Redux…" (fourtailslampwork, 2008): modern beads have their release reamed out, so a
      // clean hole is no proof; nitric acid hazards: ACS Chemical Laboratory Information Profile, 2002.
      const res = await aid({ observations: { hole: 'clean' } }).expect(200);
      expect(res.body.indications[0].origin ?? res.body.indications[0].technique).toMatch(
        /venice-murano|wound-lampwork/,
      );
      expect(res.body.indications[0].score).toBe(1);
      expect(res.body.cautions.map((c: { rule: string }) => c.rule)).toContain('acid-history');
    });

    it('words naming uranium or lead crystal bring their handling cautions', async () => {
      // Uranium handling: US NRC NUREG-1717; lead crystal: "Crystal" (tamararubin.com) and "Can
      // Crystal Beads Cause Lead Poisoning?" (The Spruce Crafts).
      const res = await aid({ words: ['Uranium glass beads', 'with lead crystal spacers'] }).expect(200);
      expect(res.body.cautions.map((c: { rule: string }) => c.rule).sort()).toEqual([
        'lead-glass',
        'uranium-handling',
      ]);
      const china = await aid({ recordedOrigins: ['china'] }).expect(200);
      expect(china.body.cautions.map((c: { rule: string }) => c.rule)).toEqual(['lead-glass']);
      const bad = await aid({ words: 'uranium', recordedOrigins: ['atlantis'] }).expect(400);
      expect(new Set(bad.body.error.fields.map((f: { field: string }) => f.field))).toEqual(
        new Set(['recordedOrigins', 'words']),
      );
    });

    it('aventurine dated 1550–1580 draws a warning; 1850–1900 does not', async () => {
      // Aventurine glass is a 17th-century Murano invention: "The Venetian Bead Story, Part 2:
      // The Beads" (The Margaretologist vol. 12 no. 1, 1999, Peter Francis Jr.) gives 1677, Miotti.
      const early = await aid({
        decoration: ['aventurine'],
        draft: { period: { from: 1550, to: 1580 } },
      }).expect(200);
      expect(early.body.warnings.map((w: { rule: string }) => w.rule)).toEqual(['aventurine-17th-century']);
      expect(early.body.warnings[0].wholePeriod).toBe(true);
      expect(early.body.warnings[0].sources[0].url).toMatch(/^https?:\/\//);
      const late = await aid({
        decoration: ['aventurine'],
        draft: { period: { from: 1850, to: 1900 } },
      }).expect(200);
      expect(late.body.warnings).toEqual([]);
    });

    it('a green glow before the 1830s and Venetian lampwork before 1528 draw warnings', async () => {
      // Uranium glass in commerce from the 1830s (EPFL Graph Search "Uranium glass"; a University of
      // Bristol student page); a green glow is only a hint ("What Types of Glass Glow Under a Black Light?").
      const uranium = await aid({
        observations: { uvA: 'green-glow' },
        draft: { period: { from: 1800, to: 1820 } },
      }).expect(200);
      expect(uranium.body.warnings.map((w: { rule: string }) => w.rule)).toEqual(['uranium-1830s']);
      expect(uranium.body.warnings[0].clueIsHint).toBe(true);
      const cautions = uranium.body.cautions.map((c: { rule: string }) => c.rule).sort();
      // UV-A torch safety (Univ. of Arizona UV Radiation Safety; UMass EHS) and uranium handling (US NRC NUREG-1717).
      expect(cautions).toEqual(['uranium-handling', 'uv-a-torch']);
      // The Venetian lampworkers' guild (Supialume) founded 1528: The Margaretologist vol. 12 no. 1
      // (1999), Peter Francis Jr.; lamp beads from about 1615: Corning Museum of Glass, 70.3.269 D.
      const lamp = await aid({
        draft: { origin: 'venice-murano', technique: 'wound-lampwork', period: { from: 1500, to: 1650 } },
      }).expect(200);
      expect(lamp.body.warnings.map((w: { rule: string }) => w.rule)).toEqual([
        'venetian-lampwork-16th-century',
      ]);
      expect(lamp.body.warnings[0].wholePeriod).toBe(false);
      // Museum sources come first on screen.
      expect(lamp.body.warnings[0].sources[0].standing).toBe('museum');
    });

    it('answers without a sign-in, and refuses bad input with the field named', async () => {
      const res = await aid({ observations: { hole: 'sticky' }, decoration: ['glitter'] }).expect(400);
      const fields = res.body.error.fields.map((f: { field: string }) => f.field);
      expect(fields).toEqual(expect.arrayContaining(['observations.hole', 'decoration']));
      await aid({ draft: { period: { from: 'old', to: 1900 } } }).expect(400);
      await aid({}).expect(200);
    });
  });
});
