import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TERMS_VERSION } from '../../shared/legal';
import { bids, jobs, ledgerEntries, mailOutbox, payments, shops, users } from '../../server/db/schema';
import { enqueueMail } from '../../server/lib/mail/outbox';
import type { RenderedMail } from '../../server/lib/mail/templates';
import { bidInput, createJob, createShop, createUser, uniqueEmail } from '../factories';
import { deliverQueuedMail, mailFromMaildev } from '../setup/mail-links';
import { agentFor, setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

/** A postal address (invented) for the shop's receiving address or a job's return trip. */
const RETURN_ADDRESS = { lines: ['7 Feeler Row'], city: 'Ashgrove', region: 'Ohio', postalCode: '43001', country: 'United States' };

/** Builder and shop with a job of the builder's awarded to the shop (its bid accepted through the API). */
async function awardedJob(title = 'Small block, bore and hone') {
  const builder = await createUser(ctx.db, { displayName: 'Ivo Pennybrook' });
  const { user: shopUser, shop } = await createShop(ctx.db, {}, { displayName: 'Gant Street Machine' });
  const job = await createJob(ctx.db, builder.id, { input: { title } });
  const shopApi = await signedIn(ctx.app, shopUser);
  const bid = await shopApi.post(`/api/jobs/${job.id}/bids`, bidInput());
  expect(bid.status).toBe(201);
  const builderApi = await signedIn(ctx.app, builder);
  expect((await builderApi.post(`/api/bids/${bid.body.bid.id}/accept`)).status).toBe(200);
  return { builder, builderApi, shopUser, shop, shopApi, jobId: job.id, bidId: bid.body.bid.id as string };
}

/** The job paid for and held: the paid payment and its ledger line written as the webhook would (the money route is tested in payments.test.ts). */
async function fund(jobId: string, bidId: string) {
  const [bid] = await ctx.db.select().from(bids).where(eq(bids.id, bidId));
  const [payment] = await ctx.db
    .insert(payments)
    .values({ jobId, kind: 'bid', amountCents: bid.totalCents, status: 'paid', paidAt: new Date(), chargeId: `ch_settings_${bidId.slice(0, 8)}` })
    .returning();
  await ctx.db.insert(ledgerEntries).values({ jobId, paymentId: payment.id, kind: 'paid_in', amountCents: bid.totalCents, reference: payment.chargeId! });
  await ctx.db.update(jobs).set({ status: 'funded' }).where(eq(jobs.id, jobId));
}

describe('changing the password', () => {
  it('when the password is changed, then another signed-in session gets 401 and this one stays signed in with the new password working', async () => {
    const user = await createUser(ctx.db);
    const here = await signedIn(ctx.app, user);
    const elsewhere = await signedIn(ctx.app, user);
    await elsewhere.get('/api/auth/me').expect(200);

    const res = await here.post('/api/auth/password', { currentPassword: user.password, newPassword: 'a brand new long password' });
    expect(res.status).toBe(200);
    await elsewhere.get('/api/auth/me').expect(401);
    await here.get('/api/auth/me').expect(200);
    await signedIn(ctx.app, { email: user.email, password: 'a brand new long password' });
  });

  it('when the current password is wrong, then 400 beside the field and nothing changes', async () => {
    const user = await createUser(ctx.db);
    const here = await signedIn(ctx.app, user);
    const res = await here.post('/api/auth/password', { currentPassword: 'not my password at all', newPassword: 'a brand new long password' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.currentPassword).toBe('This is not your current password.');
    await signedIn(ctx.app, user);
  });
});

describe('changing the e-mail address', () => {
  it('when a new address is asked for, then nothing changes until the link mailed there is followed; then the old address is told', async () => {
    const user = await createUser(ctx.db, { displayName: 'Wren Halloway' });
    const client = await signedIn(ctx.app, user);
    const newEmail = uniqueEmail('moved');

    const asked = await client.post('/api/me/email', { newEmail, currentPassword: user.password });
    expect(asked.status).toBe(202);
    expect(asked.body).toEqual({ pendingEmail: newEmail });
    const me = await client.get('/api/auth/me').expect(200);
    expect(me.body.user).toMatchObject({ email: user.email, pendingEmail: newEmail });

    await deliverQueuedMail(ctx.db);
    const mail = await mailFromMaildev(newEmail, 'Confirm your new e-mail address for Tenthmark');
    const token = /\/confirm-new-email\?token=([\w-]+)/.exec(mail.text)?.[1];
    expect(token).toBeDefined();

    // Followed signed out, in another browser: the link is the proof.
    const confirmed = await (await agentFor(ctx.app)).post('/api/me/email/confirm', { token });
    expect(confirmed.status).toBe(200);
    expect(confirmed.body).toEqual({ email: newEmail, changed: true });
    const after = await client.get('/api/auth/me').expect(200);
    expect(after.body.user).toMatchObject({ email: newEmail, pendingEmail: null, emailVerified: true });

    await deliverQueuedMail(ctx.db);
    const notice = await mailFromMaildev(user.email, 'Your Tenthmark e-mail address was changed');
    expect(notice.text).toContain(newEmail);
    // The link works once; the new address signs in.
    expect((await client.post('/api/me/email/confirm', { token })).status).toBe(400);
    await signedIn(ctx.app, { email: newEmail, password: user.password });
  });

  it('when a reset link went to the old address, then it stops working once the account moves (the old mailbox may be why it moved)', async () => {
    const user = await createUser(ctx.db);
    const client = await signedIn(ctx.app, user);
    const stranger = await agentFor(ctx.app);
    expect((await stranger.post('/api/auth/password-reset/request', { email: user.email })).status).toBe(202);
    const [resetMail] = await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, user.email), eq(mailOutbox.template, 'reset_password')));
    const resetToken = /token=([\w-]+)/.exec(resetMail.textBody)?.[1];
    expect(resetToken).toBeDefined();

    const newEmail = uniqueEmail('moved-away');
    expect((await client.post('/api/me/email', { newEmail, currentPassword: user.password })).status).toBe(202);
    const [changeMail] = await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, newEmail), eq(mailOutbox.template, 'confirm_new_email')));
    const changeToken = /token=([\w-]+)/.exec(changeMail.textBody)?.[1];
    expect((await stranger.post('/api/me/email/confirm', { token: changeToken })).status).toBe(200);

    const stale = await stranger.post('/api/auth/password-reset/confirm', { token: resetToken, password: 'taken over by the old inbox' });
    expect(stale.status).toBe(400);
    expect(stale.body.error.code).toBe('link_expired');
    await signedIn(ctx.app, { email: newEmail, password: user.password });
  });

  it.each(['changed', 'reset by mail'] as const)(
    'when a move to another address is pending and the password is then %s, then its link no longer moves the account (whoever asked for it may be why the password changed)',
    async (how) => {
      const user = await createUser(ctx.db);
      const intruder = await signedIn(ctx.app, user);
      const theirs = uniqueEmail('intruder');
      expect((await intruder.post('/api/me/email', { newEmail: theirs, currentPassword: user.password })).status).toBe(202);
      const [changeMail] = await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, theirs), eq(mailOutbox.template, 'confirm_new_email')));
      const changeToken = /token=([\w-]+)/.exec(changeMail.textBody)![1];

      const newPassword = 'taken back by the owner';
      if (how === 'changed') {
        const owner = await signedIn(ctx.app, user);
        expect((await owner.post('/api/auth/password', { currentPassword: user.password, newPassword })).status).toBe(200);
      } else {
        const owner = await agentFor(ctx.app);
        expect((await owner.post('/api/auth/password-reset/request', { email: user.email })).status).toBe(202);
        const [resetMail] = await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, user.email), eq(mailOutbox.template, 'reset_password')));
        const resetToken = /token=([\w-]+)/.exec(resetMail.textBody)![1];
        expect((await owner.post('/api/auth/password-reset/confirm', { token: resetToken, password: newPassword })).status).toBe(200);
      }

      const late = await (await agentFor(ctx.app)).post('/api/me/email/confirm', { token: changeToken });
      expect(late.status).toBe(400);
      expect(late.body.error.code).toBe('link_expired');
      const [after] = await ctx.db.select().from(users).where(eq(users.id, user.id));
      expect(after).toMatchObject({ email: user.email, pendingEmail: null });
      await signedIn(ctx.app, { email: user.email, password: newPassword });
    },
  );

  it('when the address belongs to another account, then 409 in the same words as sign-up; a wrong password is 400', async () => {
    const user = await createUser(ctx.db);
    const other = await createUser(ctx.db);
    const client = await signedIn(ctx.app, user);
    const taken = await client.post('/api/me/email', { newEmail: other.email.toUpperCase(), currentPassword: user.password });
    expect(taken.status).toBe(409);
    expect(taken.body.error.code).toBe('email_taken');
    expect(taken.body.error.fields.newEmail).toBe('An account with this e-mail address already exists. Sign in instead, or reset your password.');

    const wrong = await client.post('/api/me/email', { newEmail: uniqueEmail(), currentPassword: 'not my password at all' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.currentPassword).toBeDefined();
    const [row] = await ctx.db.select().from(users).where(eq(users.id, user.id));
    expect(row.pendingEmail).toBeNull();
  });
});

describe('export', () => {
  it('when a builder exports, then the JSON holds their job and its spec, the bid and the money, and no e-mail address but their own', async () => {
    const { builder, builderApi, shopUser, jobId, bidId } = await awardedJob('Export block, deck and hone');
    await fund(jobId, bidId);
    const res = await builderApi.get('/api/me/export').expect(200);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="tenthmark-my-data-/);
    expect(res.body.profile).toMatchObject({ id: builder.id, email: builder.email });
    expect(res.body.jobs.map((j: { id: string }) => j.id)).toEqual([jobId]);
    expect(res.body.jobs[0].spec).toBeDefined();
    expect(res.body.bids[0]).toMatchObject({ id: bidId, shopName: expect.any(String) });
    expect(res.body.payments).toHaveLength(1);
    expect(res.body.ledger[0]).toMatchObject({ kind: 'paid_in', jobTitle: 'Export block, deck and hone' });
    const text = JSON.stringify(res.body);
    expect(text).not.toContain(shopUser.email);
    expect(text).not.toMatch(/argon2/);
  });

  it('when a job title starts like a formula, then the CSV puts it behind a quote', async () => {
    const { builderApi, jobId, bidId } = await awardedJob('=HYPERLINK("http://evil.example","click")');
    await fund(jobId, bidId);
    const res = await builderApi.get('/api/me/export.csv').expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const lines = res.text.trim().split('\n');
    expect(lines[0]).toBe('record,date,job_id,job_title,status_or_kind,amount_cents,amount');
    const jobLine = lines.find((l) => l.startsWith('job,'));
    expect(jobLine).toContain(`"'=HYPERLINK(""http://evil.example"",""click"")"`);
    expect(lines.some((l) => l.startsWith('money,') && l.includes(',paid_in,'))).toBe(true);
  });
});

describe('deleting the account', () => {
  it('when a funded job is in progress, then deletion is refused with the job named; after completion it goes through and the shop still sees the job', async () => {
    const { builder, builderApi, shopApi, jobId, bidId } = await awardedJob('Deletion test block');
    await fund(jobId, bidId);

    const check = await builderApi.get('/api/me/deletion').expect(200);
    expect(check.body.allowed).toBe(false);
    expect(check.body.blockers).toEqual([{ jobId, jobTitle: 'Deletion test block', reason: expect.stringMatching(/held/) }]);
    const refused = await builderApi.post('/api/me/delete', { currentPassword: builder.password });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toContain('Deletion test block');

    await ctx.db.update(jobs).set({ status: 'completed', returnAddress: RETURN_ADDRESS }).where(eq(jobs.id, jobId));
    expect((await builderApi.get('/api/me/deletion').expect(200)).body).toEqual({ allowed: true, blockers: [], alsoHappens: [] });
    const elsewhere = await signedIn(ctx.app, builder);
    expect((await builderApi.post('/api/me/delete', { currentPassword: 'not my password at all' })).status).toBe(400);
    const deleted = await builderApi.post('/api/me/delete', { currentPassword: builder.password });
    expect(deleted.status).toBe(200);

    await builderApi.get('/api/auth/me').expect(401);
    await elsewhere.get('/api/auth/me').expect(401);
    const signIn = await (await agentFor(ctx.app)).post('/api/auth/login', { email: builder.email, password: builder.password });
    expect(signIn.status).toBe(401);
    const [row] = await ctx.db.select().from(users).where(eq(users.id, builder.id));
    expect(row).toMatchObject({ status: 'closed', displayName: 'Deleted account', passwordHash: null, email: `deleted-${builder.id}@deleted.invalid` });

    const seen = await shopApi.get(`/api/jobs/${jobId}`).expect(200);
    expect(seen.body.job.builder.displayName).toBe('Deleted account');
    // The address the parts went back to identified the person too; the finished job no longer needs it.
    const [finished] = await ctx.db.select().from(jobs).where(eq(jobs.id, jobId));
    expect(finished.returnAddress).toBeNull();

    // A notice about the job for the closed account is kept, never sent to its placeholder address.
    const id = await enqueueMail(ctx.db, row.email, { subject: 'A review', text: 'x', html: '<p>x</p>', template: 'review_received' } as RenderedMail);
    const [mail] = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.id, id));
    expect(mail.status).toBe('skipped');
  });

  it('when a shop deletes its account, then its open bids are withdrawn and it leaves the directory', async () => {
    const builder = await createUser(ctx.db);
    const job = await createJob(ctx.db, builder.id);
    const { user, shop } = await createShop(ctx.db);
    await ctx.db.update(shops).set({ receivingAddress: RETURN_ADDRESS }).where(eq(shops.id, shop.id));
    const shopApi = await signedIn(ctx.app, user);
    const bid = await shopApi.post(`/api/jobs/${job.id}/bids`, bidInput());
    const check = await shopApi.get('/api/me/deletion').expect(200);
    expect(check.body).toMatchObject({ allowed: true, alsoHappens: [expect.stringContaining('withdrawn')] });
    expect((await shopApi.post('/api/me/delete', { currentPassword: user.password })).status).toBe(200);
    const [row] = await ctx.db.select().from(bids).where(eq(bids.id, bid.body.bid.id));
    expect(row.status).toBe('withdrawn');
    const [profile] = await ctx.db.select().from(shops).where(eq(shops.id, shop.id));
    expect(profile.name).toBe('Deleted account');
    expect(profile.receivingAddress).toBeNull();
    await (await agentFor(ctx.app)).get(`/api/shops/${shop.id}`).expect(404);
  });
});

describe('consent at sign-up', () => {
  it('when the terms are not accepted, then sign-up is 400 beside the box; accepted, the version and time are stored', async () => {
    const client = await agentFor(ctx.app);
    const base = { displayName: 'Tamsin Oakridge', email: uniqueEmail('consent'), password: 'a long enough password', role: 'builder' };
    const refused = await client.post('/api/auth/signup', base);
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.acceptTerms).toBe('Tick the box to accept the terms and the privacy notice.');
    expect((await client.post('/api/auth/signup', { ...base, acceptTerms: false })).status).toBe(400);

    expect((await client.post('/api/auth/signup', { ...base, acceptTerms: true })).status).toBe(201);
    const [row] = await ctx.db.select().from(users).where(eq(users.email, base.email));
    expect(row.termsVersion).toBe(TERMS_VERSION);
    expect(row.termsAcceptedAt).toBeInstanceOf(Date);
  });
});
