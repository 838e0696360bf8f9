import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { FakeSmtpService as FakeSmtp } from '../src/mail/fake-smtp.service';
import { createAccount, PUBLIC_CARD_FIELDS, signIn } from './support/accounts';
import { binary, upload } from './support/exhibit-http';
import { description } from './support/lot-fixtures';
import { lockBlobNames } from '../src/storage/blob-locks';
import { BLOB_STORE, type BlobStore } from '../src/storage/blob-store';
import { lastMailTo, linkIn } from './support/mail';
import { useTestApp } from './support/test-app';

const BASE = 'http://beadroll.example';
const W = { 'X-Beadroll-Request': '1' };

/** What an applicant tells the registrar about their trade (invented). */
const TRADE_DETAILS = {
  business: 'Vetro Trade Beads',
  town: 'Zanfirico Cross',
  country: 'Punty Reach',
  address: '12 Cinder Row, Zanfirico Cross',
  website: 'https://vetro-beads.example',
  tradeReferences: 'Stand 7 at the Zanfirico Cross winter bead fair; buys from Rue Lampwork Finds.',
};

function applicant(n: string) {
  return {
    role: 'dealer',
    displayName: `Dana Vetro ${n}`,
    handle: `dana-vetro-${n}`,
    ...TRADE_DETAILS,
    email: `dana.${n}@example.invalid`,
    password: 'a long enough passphrase',
  };
}

describe('accounts: sign-up, e-mail, verification by the registrar, passwords', () => {
  let http: () => ReturnType<typeof request>;
  const t = useTestApp();
  beforeAll(async () => {
    http = () => request(t.app.getHttpServer());
  });

  it('sign-up → verification mail → link page → POST confirm → registrar approves → a verified dealer signs in', async () => {
    const registrar = await createAccount(t, { role: 'registrar' });
    const a = applicant('one');
    const res = await http().post('/api/auth/sign-up').set(W).send(a).expect(202);
    expect(res.body.message).toMatch(/check your e-mail/i);

    // Not yet: the address is unconfirmed.
    const early = await http()
      .post('/api/auth/sign-in')
      .set(W)
      .send({ email: a.email, password: a.password });
    expect(early.status).toBe(403);
    expect(early.body.error.code).toBe('email_unverified');

    const mail = lastMailTo(t, a.email);
    expect(mail.subject).toMatch(/confirm your e-mail/i);
    expect(mail.html).toContain('<a href=');
    expect(mail.text).toMatch(/because someone signed up/i);
    const link = linkIn(mail, `${BASE}/verify-email`);
    const token = link.searchParams.get('token')!;
    expect(token.length).toBeGreaterThanOrEqual(40);

    await http().post('/api/auth/verify-email').set(W).send({ token }).expect(200);
    // Single use.
    const again = await http().post('/api/auth/verify-email').set(W).send({ token }).expect(400);
    expect(again.body.error.code).toBe('token_invalid');
    expect(lastMailTo(t, registrar.email).subject).toMatch(/new account to verify/i);

    const dealer = await signIn(t, a.email, a.password);
    const me = await dealer.get('/api/account').expect(200);
    expect(me.body).toMatchObject({
      status: 'pending',
      handle: a.handle,
      emailVerified: true,
      verifiedSince: null,
    });
    await http().get(`/api/public/dealers/${a.handle}`).expect(404);

    const queue = await registrar.agent.get('/api/registry/accounts?status=pending').expect(200);
    const row = queue.body.items.find((i: { handle: string }) => i.handle === a.handle);
    expect(row).toMatchObject(TRADE_DETAILS);
    await registrar.agent.post(`/api/registry/accounts/${row.id}/approve`).set(W).expect(200);
    expect(lastMailTo(t, a.email).subject).toMatch(/verified/i);

    const after = await dealer.get('/api/auth/session').expect(200);
    expect(after.body.account.status).toBe('verified');
    const card = await http().get(`/api/public/dealers/${a.handle}`).expect(200);
    expect(Object.keys(card.body).sort()).toEqual(PUBLIC_CARD_FIELDS);
    expect(card.body).toMatchObject({ id: row.id, status: 'verified', town: 'Zanfirico Cross' });
  });

  it('takes an optional document with the application, shown to the registrar alone; refuses other types and sizes by name', async () => {
    const registrar = await createAccount(t, { role: 'registrar' });
    const dealer = await createAccount(t, { role: 'dealer' });
    const form = (a: Record<string, string>) => {
      let req = http().post('/api/auth/sign-up').set(W);
      for (const [k, v] of Object.entries(a)) req = req.field(k, v);
      return req;
    };
    const a = applicant('doc');
    // Refused first, and nothing kept: a text file, an empty one, one over 10 MB.
    for (const [bytes, name, type] of [
      [Buffer.from('just some words'), 'letter.txt', 'text/plain'],
      [Buffer.alloc(0), 'empty.pdf', 'application/pdf'],
      [
        Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.alloc(10 * 1024 * 1024)]),
        'big.pdf',
        'application/pdf',
      ],
    ] as const) {
      const bad = await form(a).attach('document', bytes, { filename: name, contentType: type }).expect(400);
      expect(bad.body.error.fields).toEqual([
        expect.objectContaining({ field: 'document', reason: expect.stringMatching(/PDF, JPEG or PNG/) }),
      ]);
    }
    const twoFiles = await form(a)
      .attach('document', Buffer.from('%PDF-1.4\n'), 'a.pdf')
      .attach('document', Buffer.from('%PDF-1.4\n'), 'b.pdf')
      .expect(400);
    expect(twoFiles.body.error.fields[0].field).toBe('document');
    // A PDF (its first bytes say so, per ISO 32000-1 §7.5.2 "%PDF-"), as a form with the other fields.
    const pdf = Buffer.from('%PDF-1.4\n% an invented trade licence\n%%EOF\n');
    await form(a)
      .attach('document', pdf, { filename: 'Trade licence 2026.pdf', contentType: 'application/pdf' })
      .expect(202);
    const confirm = async (email: string) => {
      const token = linkIn(lastMailTo(t, email), `${BASE}/verify-email`).searchParams.get('token')!;
      await http().post('/api/auth/verify-email').set(W).send({ token }).expect(200);
    };
    await confirm(a.email);
    const queue = await registrar.agent.get('/api/registry/accounts?status=pending').expect(200);
    const row = queue.body.items.find((x: { handle: string }) => x.handle === a.handle);
    expect(row.document).toEqual({
      sha256: createHash('sha256').update(pdf).digest('hex'),
      mediaType: 'application/pdf',
      size: pdf.length,
      name: 'Trade licence 2026.pdf',
    });
    const got = await registrar.agent
      .get(`/api/registry/accounts/${row.id}/document`)
      .buffer(true)
      .parse(binary)
      .expect(200);
    expect(got.headers['content-type']).toMatch(/^application\/pdf/);
    expect(got.headers['content-disposition']).toMatch(/^attachment/);
    expect(Buffer.compare(got.body as Buffer, pdf)).toBe(0);
    await dealer.agent.get(`/api/registry/accounts/${row.id}/document`).expect(403);
    // An application without a document still reads as JSON, and has none.
    const b = applicant('nodoc');
    await http().post('/api/auth/sign-up').set(W).send(b).expect(202);
    await confirm(b.email);
    const later = await registrar.agent.get('/api/registry/accounts?status=pending').expect(200);
    const none = later.body.items.find((x: { handle: string }) => x.handle === b.handle);
    expect(none.document).toBeNull();
    await registrar.agent.get(`/api/registry/accounts/${none.id}/document`).expect(404);
  });

  it('deletes an applicant’s document when the account closes, unless another account or an exhibit names the same bytes', async () => {
    const blobs = t.app.get<BlobStore>(BLOB_STORE);
    const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
    // PDFs by their first bytes ("%PDF-", ISO 32000-1 §7.5.2), ending in "%%EOF" (§7.5.5); invented.
    const own = Buffer.from('%PDF-1.4\n% a trade licence kept by one applicant\n%%EOF\n');
    const shared = Buffer.from('%PDF-1.4\n% a market permit two applicants both sent\n%%EOF\n');
    const join = async (n: string, doc: Buffer) => {
      const a = applicant(n);
      let req = http().post('/api/auth/sign-up').set(W);
      for (const [k, v] of Object.entries(a)) req = req.field(k, v);
      await req
        .attach('document', doc, { filename: 'permit.pdf', contentType: 'application/pdf' })
        .expect(202);
      const token = linkIn(lastMailTo(t, a.email), `${BASE}/verify-email`).searchParams.get('token')!;
      await http().post('/api/auth/verify-email').set(W).send({ token }).expect(200);
      return { a, agent: await signIn(t, a.email, a.password) };
    };
    const close = async (who: { a: { password: string }; agent: Awaited<ReturnType<typeof signIn>> }) =>
      who.agent.post('/api/account/close').set(W).send({ password: who.a.password }).expect(200);
    const alone = await join('closes-alone', own);
    const first = await join('closes-first', shared);
    const second = await join('closes-second', shared);
    expect(await blobs.exists(sha(own))).toBe(true);

    await close(alone);
    expect(await blobs.exists(sha(own))).toBe(false);
    // Another applicant still names the shared file.
    await close(first);
    expect(await blobs.exists(sha(shared))).toBe(true);
    // A dealer adds the same file as an exhibit: it stays when the last applicant leaves too.
    const dealer = await createAccount(t, { role: 'dealer' });
    const lot = await dealer.agent.post('/api/lots').set(W).send({ description: description() }).expect(201);
    await upload(
      dealer.agent,
      lot.body.code,
      shared,
      { kind: 'reference-page' },
      'permit.pdf',
      'application/pdf',
    ).expect(201);
    await close(second);
    expect(await blobs.exists(sha(shared))).toBe(true);
  });

  it('stores an applicant’s document in the transaction that records the account, under the name’s lock', async () => {
    const blobs = t.app.get<BlobStore>(BLOB_STORE);
    const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
    // A PDF by its first bytes ("%PDF-", ISO 32000-1 §7.5.2); invented.
    const doc = Buffer.from('%PDF-1.4\n% a dealer licence sent while another copy is deleted\n%%EOF\n');
    const signUp = (a: ReturnType<typeof applicant>) => {
      let req = http().post('/api/auth/sign-up').set(W);
      for (const [k, v] of Object.entries(a)) req = req.field(k, v);
      return req.attach('document', doc, { filename: 'licence.pdf', contentType: 'application/pdf' });
    };

    // An account closing with the same bytes holds their name exclusively while it deletes them:
    // the sign-up waits, then stores the bytes again, so its account never names missing bytes.
    await blobs.put({ stream: Readable.from(doc) });
    const closing = t.app.get(DataSource).createQueryRunner();
    await closing.connect();
    await closing.startTransaction();
    await lockBlobNames(closing.manager, [sha(doc)], 'exclusive');
    const a = applicant('races-a-close');
    const pending = signUp(a).then((r) => r);
    await new Promise((r) => setTimeout(r, 500));
    await blobs.delete(sha(doc));
    await closing.commitTransaction();
    await closing.release();
    expect((await pending).status).toBe(202);
    expect(await blobs.exists(sha(doc))).toBe(true);

    // A document that cannot be stored leaves no account: the same sign-up succeeds on a retry.
    const b = applicant('store-fails');
    const put = jest.spyOn(blobs, 'put').mockRejectedValueOnce(new Error('the disk is full'));
    try {
      await signUp(b).expect(500);
    } finally {
      put.mockRestore();
    }
    expect(await t.app.get(DataSource).query('SELECT 1 FROM accounts WHERE handle = $1', [b.handle])).toEqual(
      [],
    );
    await signUp(b).expect(202);
    expect(lastMailTo(t, b.email).subject).toMatch(/confirm your e-mail/i);
  });

  it('asks for the business address and trade references, and a website only as a web address', async () => {
    const { address: _a, tradeReferences: _t, ...rest } = applicant('nodetails');
    const res = await http()
      .post('/api/auth/sign-up')
      .set(W)
      .send({ ...rest, website: 'vetro beads' })
      .expect(400);
    const fields = (res.body.error.fields as Array<{ field: string; reason: string }>).map((f) => f.field);
    expect(fields.sort()).toEqual(['address', 'tradeReferences', 'website']);
    const ok = await http()
      .post('/api/auth/sign-up')
      .set(W)
      .send({ ...applicant('nosite'), website: '  ' })
      .expect(202);
    expect(ok.body.message).toBeDefined();
  });

  it('a second sign-up with a known address answers the same and mails the owner a notice', async () => {
    const owner = await createAccount(t, { role: 'dealer' });
    const res = await http()
      .post('/api/auth/sign-up')
      .set(W)
      .send({ ...applicant('two'), email: owner.email.toUpperCase() })
      .expect(202);
    expect(res.body.message).toMatch(/check your e-mail/i);
    expect(lastMailTo(t, owner.email).subject).toMatch(/tried to sign up/i);
    await http().get('/api/public/dealers/dana-vetro-two').expect(404);
  });

  it('refuses a taken handle, a weak password, over-long and unknown fields with 400 naming the field', async () => {
    const taken = await createAccount(t, { role: 'dealer' });
    const r1 = await http()
      .post('/api/auth/sign-up')
      .set(W)
      .send({ ...applicant('three'), handle: taken.handle })
      .expect(400);
    expect(r1.body.error.fields).toEqual([{ field: 'handle', reason: 'is already taken' }]);

    const r2 = await http()
      .post('/api/auth/sign-up')
      .set(W)
      .send({ ...applicant('four'), password: 'short' })
      .expect(400);
    expect(r2.body.error.fields).toEqual([
      { field: 'password', reason: 'must be 12 to 128 characters long' },
    ]);

    const r3 = await http()
      .post('/api/auth/sign-up')
      .set(W)
      .send({ ...applicant('five'), business: 'x'.repeat(121) })
      .expect(400);
    expect(r3.body.error.fields[0]).toMatchObject({ field: 'business' });

    const r4 = await http()
      .post('/api/auth/sign-up')
      .set(W)
      .send({ ...applicant('six'), role: 'registrar', isAdmin: true })
      .expect(400);
    const fields = r4.body.error.fields.map((f: { field: string }) => f.field).sort();
    expect(fields).toEqual(['isAdmin', 'role']);

    const r5 = await http()
      .post('/api/auth/sign-up')
      .set(W)
      .send({ ...applicant('seven'), handle: 'Upper_Case' })
      .expect(400);
    expect(r5.body.error.fields[0].field).toBe('handle');
    // Nothing was created by any of them.
    for (const n of ['four', 'five', 'six', 'seven']) {
      expect(t.app.get(FakeSmtp).to(`dana.${n}@example.invalid`)).toEqual([]);
    }
  });

  it('forgotten password: mail, link, POST with the new password; old sessions end; token single-use', async () => {
    const a = await createAccount(t, { role: 'dealer' });
    await http().post('/api/auth/forgot-password').set(W).send({ email: a.email }).expect(202);
    const unknown = await http()
      .post('/api/auth/forgot-password')
      .set(W)
      .send({ email: 'nobody@example.invalid' })
      .expect(202);
    expect(unknown.body.message).toMatch(/check your e-mail/i);
    const token = linkIn(lastMailTo(t, a.email), `${BASE}/reset-password`).searchParams.get('token')!;

    const weak = await http()
      .post('/api/auth/reset-password')
      .set(W)
      .send({ token, password: 'short' })
      .expect(400);
    expect(weak.body.error.fields[0]).toEqual({
      field: 'password',
      reason: 'must be 12 to 128 characters long',
    });

    await http()
      .post('/api/auth/reset-password')
      .set(W)
      .send({ token, password: 'a brand new passphrase' })
      .expect(200);
    const reused = await http()
      .post('/api/auth/reset-password')
      .set(W)
      .send({ token, password: 'another new passphrase' })
      .expect(400);
    expect(reused.body.error.code).toBe('token_invalid');
    // The agent signed in before the reset is signed out.
    expect((await a.agent.get('/api/auth/session')).body.account).toBeNull();
    await http().post('/api/auth/sign-in').set(W).send({ email: a.email, password: a.password }).expect(401);
    await signIn(t, a.email, 'a brand new passphrase');
  });

  it('change password ends every other session but keeps this one', async () => {
    const a = await createAccount(t, { role: 'assessor' });
    const other = await signIn(t, a.email, a.password);
    const wrong = await a.agent
      .post('/api/account/password')
      .set(W)
      .send({ currentPassword: 'wrong', newPassword: 'my second passphrase' })
      .expect(400);
    expect(wrong.body.error.fields[0].field).toBe('currentPassword');
    await a.agent
      .post('/api/account/password')
      .set(W)
      .send({ currentPassword: a.password, newPassword: 'my second passphrase' })
      .expect(200);
    expect((await a.agent.get('/api/account')).status).toBe(200);
    expect((await other.get('/api/account')).status).toBe(401);
  });

  it('rejects with an e-mailed reason; suspends (revoking sessions, refusing writes), reinstates', async () => {
    const registrar = await createAccount(t, { role: 'registrar' });
    const pending = await createAccount(t, { role: 'dealer', status: 'pending' });
    const bad = await registrar.agent
      .post(`/api/registry/accounts/${pending.id}/reject`)
      .set(W)
      .send({})
      .expect(400);
    expect(bad.body.error.fields[0].field).toBe('reason');
    await registrar.agent
      .post(`/api/registry/accounts/${pending.id}/reject`)
      .set(W)
      .send({ reason: 'No trading address could be confirmed.' })
      .expect(200);
    const mail = lastMailTo(t, pending.email);
    expect(mail.text).toContain('No trading address could be confirmed.');
    expect(mail.html).toContain('No trading address could be confirmed.');

    const dealer = await createAccount(t, { role: 'dealer' });
    await registrar.agent
      .post(`/api/registry/accounts/${dealer.id}/suspend`)
      .set(W)
      .send({ reason: 'Listed beads that were not theirs.' })
      .expect(200);
    expect((await dealer.agent.get('/api/account')).status).toBe(401);
    const again = await signIn(t, dealer.email, dealer.password);
    expect((await again.get('/api/account')).body.status).toBe('suspended');
    expect((await http().get(`/api/public/dealers/${dealer.handle}`)).body.status).toBe('suspended');
    const twice = await registrar.agent
      .post(`/api/registry/accounts/${dealer.id}/suspend`)
      .set(W)
      .send({ reason: 'again' })
      .expect(409);
    expect(twice.body.error.code).toBe('conflict');
    await registrar.agent.post(`/api/registry/accounts/${dealer.id}/reinstate`).set(W).expect(200);
  });

  it('shows received mail on the mailbox page to loopback requests only', async () => {
    const a = await createAccount(t, { role: 'dealer' });
    await http().post('/api/auth/forgot-password').set(W).send({ email: a.email }).expect(202);
    const page = await http().get('/dev/mailbox').expect(200);
    expect(page.headers['content-type']).toMatch(/text\/html/);
    expect(page.text).toContain('Choose a new Beadroll password');
    expect(page.text).toContain(`href="${BASE}/reset-password?token=`);
    // A request relayed from elsewhere (RFC 7239 documentation address) is not loopback.
    await http().get('/dev/mailbox').set('X-Forwarded-For', '203.0.113.7').expect(404);
  });
});
