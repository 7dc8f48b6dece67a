import { parse } from 'csv-parse/sync';
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { adminActions, changeOrders, jobs, ledgerEntries, mailOutbox, moneyMoves, sessions, shops } from '../../server/db/schema';
import { jobBalance } from '../../server/modules/payments/ledger';
import { createUser, jobInput, TEST_PASSWORD } from '../factories';
import { startMoneyApp } from '../setup/money-app';
import { agentFor, signedIn } from '../setup/test-env';

let m: Awaited<ReturnType<typeof startMoneyApp>>;
let admin: Awaited<ReturnType<typeof signedIn>>;
let adminUser: Awaited<ReturnType<typeof createUser>>;
beforeAll(async () => {
  m = await startMoneyApp();
  adminUser = await createUser(m.db, { role: 'admin' });
  admin = await signedIn(m.server.app, adminUser);
});
afterAll(async () => {
  await m?.close();
});

/** A funded job whose shop has submitted an inspection record that waits for the builder. */
const recordWaiting = (totalCents = 80_000) => m.jobIn('submitted', { totalCents });

const statement = 'Cylinder four measures well over the taper limit on my own gauge.';
const decision = 'Both sides agree the work was done; the taper on one bore needs a second pass, so part is refunded.';

async function openByBuilder(funded: Awaited<ReturnType<typeof recordWaiting>>) {
  const opened = await funded.builder.post(`/api/jobs/${funded.job.id}/dispute`, { reason: 'record_outside_limits', statement });
  expect(opened.status).toBe(201);
  const queue = await admin.get('/api/admin/disputes');
  return queue.body.disputes.find((d: { jobId: string }) => d.jobId === funded.job.id) as { id: string; heldCents: number };
}

async function ledgerHolds(jobId: string) {
  const balance = await jobBalance(m.db, jobId);
  expect(balance.paidIn).toBe(balance.released + balance.fee + balance.refunded + balance.held);
  return balance;
}

describe('opening and answering a dispute', () => {
  it('when the builder disputes a waiting record, then the job is disputed, the money stays held, and both sides are told', async () => {
    const funded = await recordWaiting();
    const view = await funded.builder.get(`/api/jobs/${funded.job.id}/dispute`);
    expect(view.body).toMatchObject({ dispute: null, canRespond: false });
    expect(view.body.canOpenWith).toContain('record_outside_limits');

    // A reason that belongs to the shop is refused with a field message.
    const wrong = await funded.builder.post(`/api/jobs/${funded.job.id}/dispute`, { reason: 'builder_silent', statement });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.reason).toBeDefined();
    expect((await funded.builder.post(`/api/jobs/${funded.job.id}/dispute`, { reason: 'record_outside_limits', statement: 'short' })).status).toBe(400);

    const row = await openByBuilder(funded);
    expect(row.heldCents).toBe(80_000);
    expect((await funded.builder.get(`/api/jobs/${funded.job.id}`)).body.job.status).toBe('disputed');
    expect((await ledgerHolds(funded.job.id)).held).toBe(80_000);
    // A second dispute while one is open is refused; accepting the record is no longer possible either.
    expect((await funded.builder.post(`/api/jobs/${funded.job.id}/dispute`, { reason: 'other', statement })).status).toBe(409);
    expect((await funded.builder.post(`/api/jobs/${funded.job.id}/inspection/accept`, { version: 1 })).status).toBe(409);

    const mails = await m.db.select().from(mailOutbox).where(eq(mailOutbox.template, 'dispute_opened'));
    const to = mails.map((x) => x.toAddress);
    expect(to).toContain(funded.builderUser.email);
    expect(to).toContain(funded.shopUser.email);

    // The shop answers once; the opener cannot answer their own dispute.
    expect((await funded.shop.get(`/api/jobs/${funded.job.id}/dispute`)).body.canRespond).toBe(true);
    expect((await funded.builder.post(`/api/jobs/${funded.job.id}/dispute/response`, { statement })).status).toBe(403);
    const answer = await funded.shop.post(`/api/jobs/${funded.job.id}/dispute/response`, { statement: 'Our gauge was checked against a ring that morning; readings stand.' });
    expect(answer.status).toBe(200);
    expect(answer.body.dispute.response.by).toBe('shop');
    expect((await funded.shop.post(`/api/jobs/${funded.job.id}/dispute/response`, { statement: 'And another thing to add to it.' })).status).toBe(409);
    expect((await m.db.select().from(mailOutbox).where(and(eq(mailOutbox.template, 'dispute_answered'), eq(mailOutbox.toAddress, funded.builderUser.email)))).length).toBe(1);
  });

  it('when a stranger or another shop asks, then they cannot read or open the dispute', async () => {
    const funded = await recordWaiting();
    const stranger = await signedIn(m.server.app, await createUser(m.db));
    expect((await stranger.get(`/api/jobs/${funded.job.id}/dispute`)).status).toBe(403);
    expect((await stranger.post(`/api/jobs/${funded.job.id}/dispute`, { reason: 'other', statement })).status).toBe(403);
    expect((await admin.post(`/api/jobs/${funded.job.id}/dispute`, { reason: 'other', statement })).status).toBe(403);
    expect((await (await agentFor(m.server.app)).get(`/api/jobs/${funded.job.id}/dispute`)).status).toBe(401);
  });

  it('when the builder has not written past the agreed date, then the shop may dispute for silence; a change order too', async () => {
    const funded = await m.fundedJob();
    const before = await funded.shop.get(`/api/jobs/${funded.job.id}/dispute`);
    expect(before.body.canOpenWith).toEqual([]);
    expect((await funded.shop.post(`/api/jobs/${funded.job.id}/dispute`, { reason: 'builder_silent', statement })).body.error.code).toBe('dispute_not_allowed');

    // Move the award back past the bid's turnaround: the agreed date has gone by and the builder never wrote.
    const [job] = await m.db.select().from(jobs).where(eq(jobs.id, funded.job.id));
    await m.db.execute(sql`UPDATE bids SET decided_at = now() - interval '60 days' WHERE id = ${job.awardedBidId}`);
    expect((await funded.shop.get(`/api/jobs/${funded.job.id}/dispute`)).body.canOpenWith).toEqual(['builder_silent']);

    const [shop] = await m.db.select().from(shops).where(eq(shops.userId, funded.shopUser.id));
    await m.db.insert(changeOrders).values({ jobId: funded.job.id, shopId: shop.id, description: 'Sleeve cylinder three', amountCents: 30_000, status: 'declined' });
    expect((await funded.shop.get(`/api/jobs/${funded.job.id}/dispute`)).body.canOpenWith).toEqual(['builder_silent', 'change_order']);
    const opened = await funded.shop.post(`/api/jobs/${funded.job.id}/dispute`, { reason: 'change_order', statement: 'The builder declined the sleeve we had to fit to finish the job.' });
    expect(opened.status).toBe(201);
    expect(opened.body.dispute.openedBy).toBe('shop');
    // Once a dispute is open, the builder (the other side) answers; the builder's own opening rules do not apply.
    expect((await funded.builder.get(`/api/jobs/${funded.job.id}/dispute`)).body.canRespond).toBe(true);
  });
});

describe('resolving a dispute', () => {
  it('only an admin can resolve', async () => {
    const funded = await recordWaiting();
    const row = await openByBuilder(funded);
    for (const client of [funded.builder, funded.shop]) {
      expect((await client.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'refund', decision })).status).toBe(403);
    }
    expect((await (await agentFor(m.server.app)).post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'refund', decision })).status).toBe(401);
    expect((await funded.builder.get(`/api/admin/disputes/${row.id}`)).status).toBe(403);
    expect(await m.db.select().from(moneyMoves).where(eq(moneyMoves.jobId, funded.job.id))).toHaveLength(0);
  });

  it('a split outside 0 to the held amount gets 400 and moves nothing', async () => {
    const funded = await recordWaiting(60_000);
    const row = await openByBuilder(funded);
    for (const shopCents of [60_001, -1, 1.5]) {
      const res = await admin.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'split', shopCents, decision });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.shopCents).toBeDefined();
    }
    expect((await admin.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'split', decision })).body.error.fields.shopCents).toBeDefined();
    expect(await m.db.select().from(moneyMoves).where(eq(moneyMoves.jobId, funded.job.id))).toHaveLength(0);
    expect((await ledgerHolds(funded.job.id)).held).toBe(60_000);
  });

  it('when an admin splits, then the shop is paid its share less the fee, the rest is refunded, the decision is mailed, and the action audited', async () => {
    const funded = await recordWaiting(80_000);
    const row = await openByBuilder(funded);
    const evidence = await admin.get(`/api/admin/disputes/${row.id}`);
    expect(evidence.status).toBe(200);
    const kinds = evidence.body.timeline.map((x: { kind: string }) => x.kind);
    for (const kind of ['milestone', 'inspection', 'money', 'dispute_opened']) expect(kinds).toContain(kind);
    expect(evidence.body.money.balance.held).toBe(80_000);

    const res = await admin.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'split', shopCents: 50_000, decision });
    expect(res.status).toBe(200);
    expect(res.body.dispute.resolution).toMatchObject({ outcome: 'split', shopCents: 50_000, refundCents: 30_000 });
    const balance = await ledgerHolds(funded.job.id);
    // PLATFORM_FEE_BPS is 800 in the money app: 8 % of the shop's 50,000 is 4,000.
    expect(balance).toMatchObject({ paidIn: 80_000, released: 46_000, fee: 4_000, refunded: 30_000, held: 0 });
    expect((await funded.builder.get(`/api/jobs/${funded.job.id}`)).body.job.status).toBe('resolved');
    const transfers = await m.stripe.transfers.list({ transfer_group: funded.job.id });
    expect(transfers.data.map((t) => t.amount)).toEqual([46_000]);

    const decided = await m.db.select().from(mailOutbox).where(eq(mailOutbox.template, 'dispute_decided'));
    const forThisJob = decided.filter((x) => x.textBody.includes(decision));
    expect(forThisJob.map((x) => x.toAddress).sort()).toEqual([funded.builderUser.email, funded.shopUser.email].sort());
    const audit = await m.db.select().from(adminActions).where(and(eq(adminActions.action, 'dispute.resolve'), eq(adminActions.targetId, row.id)));
    expect(audit).toHaveLength(1);
    expect(audit[0].details).toMatchObject({ outcome: 'split', shopCents: 50_000, refundCents: 30_000 });

    // Both sides see the money in their own history.
    const builderHistory = await funded.builder.get('/api/me/money');
    expect(builderHistory.body.rows.filter((r: { jobId: string }) => r.jobId === funded.job.id).map((r: { kind: string }) => r.kind).sort()).toEqual(['fee', 'paid_in', 'refunded', 'released']);
    const shopHistory = await funded.shop.get('/api/me/money');
    expect(shopHistory.body.rows.find((r: { kind: string; jobId: string }) => r.kind === 'released' && r.jobId === funded.job.id).amountCents).toBe(46_000);
  });

  it('resolving twice (even at once) moves money once', async () => {
    const funded = await recordWaiting(40_000);
    const row = await openByBuilder(funded);
    const answers = await Promise.all([
      admin.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'release', decision }),
      admin.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'refund', decision }),
      admin.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'split', shopCents: 10_000, decision }),
    ]);
    expect(answers.map((a) => a.status).sort()).toEqual([200, 409, 409]);
    const again = await admin.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'refund', decision });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_resolved');
    const balance = await ledgerHolds(funded.job.id);
    expect(balance.held).toBe(0);
    expect(balance.released + balance.fee + balance.refunded).toBe(40_000);
    const moves = await m.db.select().from(moneyMoves).where(eq(moneyMoves.jobId, funded.job.id));
    expect(moves.every((mv) => mv.status === 'done')).toBe(true);
    const transfers = await m.stripe.transfers.list({ transfer_group: funded.job.id });
    const refunds = await m.stripe.refunds.list({ limit: 100 });
    const refundedHere = refunds.data.filter((r) => r.metadata?.job_id === funded.job.id).reduce((s, r) => s + r.amount, 0);
    expect(transfers.data.reduce((s, t) => s + t.amount, 0) + balance.fee + refundedHere).toBe(40_000);
  });

  it('when an admin refunds in full, then the builder gets everything back and the job ends resolved', async () => {
    const funded = await recordWaiting(25_000);
    const row = await openByBuilder(funded);
    expect((await admin.post(`/api/admin/disputes/${row.id}/resolve`, { outcome: 'refund', decision })).status).toBe(200);
    expect(await ledgerHolds(funded.job.id)).toMatchObject({ refunded: 25_000, released: 0, fee: 0, held: 0 });
    expect((await funded.builder.get(`/api/jobs/${funded.job.id}`)).body.job.status).toBe('resolved');
    const queue = await admin.get('/api/admin/disputes?status=resolved');
    expect(queue.body.disputes.find((d: { id: string }) => d.id === row.id)).toMatchObject({ status: 'resolved', heldCents: 0 });
  });
});

describe('reviews', () => {
  it('a review can be left once and only by a party to a completed job; the shop’s rating shows in the directory and on its bids', async () => {
    const funded = await recordWaiting(30_000);
    expect((await funded.builder.post(`/api/jobs/${funded.job.id}/reviews`, { rating: 5, comment: 'Bores came back round and straight.' })).status).toBe(409);
    expect((await funded.builder.post(`/api/jobs/${funded.job.id}/inspection/accept`, { version: 1 })).status).toBe(200);

    const stranger = await signedIn(m.server.app, await createUser(m.db));
    expect((await stranger.post(`/api/jobs/${funded.job.id}/reviews`, { rating: 1, comment: 'Never worked with them at all.' })).status).toBe(403);
    expect((await admin.post(`/api/jobs/${funded.job.id}/reviews`, { rating: 1, comment: 'Admins do not review anyone.' })).status).toBe(403);
    expect((await funded.builder.post(`/api/jobs/${funded.job.id}/reviews`, { rating: 6, comment: 'Out of range rating here.' })).status).toBe(400);

    expect((await funded.builder.get(`/api/jobs/${funded.job.id}/reviews`)).body.canReview).toBe(true);
    const first = await funded.builder.post(`/api/jobs/${funded.job.id}/reviews`, { rating: 4, comment: 'Bores came back round and straight.' });
    expect(first.status).toBe(201);
    const twice = await funded.builder.post(`/api/jobs/${funded.job.id}/reviews`, { rating: 5, comment: 'Changing my mind to five.' });
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe('already_reviewed');
    expect((await funded.shop.post(`/api/jobs/${funded.job.id}/reviews`, { rating: 5, comment: 'Paid on time and answered fast.' })).status).toBe(201);

    const listed = await funded.shop.get(`/api/jobs/${funded.job.id}/reviews`);
    expect(listed.body.canReview).toBe(false);
    expect(listed.body.reviews.map((r: { by: string; rating: number }) => [r.by, r.rating])).toEqual([
      ['builder', 4],
      ['shop', 5],
    ]);

    const [shop] = await m.db.select().from(shops).where(eq(shops.userId, funded.shopUser.id));
    const page = await stranger.get(`/api/shops/${shop.id}`);
    expect(page.body.shop.rating).toEqual({ average: 4, count: 1 });
    const directory = await stranger.get(`/api/shops?q=${encodeURIComponent(shop.name)}`);
    expect(directory.body.shops.find((s: { id: string }) => s.id === shop.id).rating).toEqual({ average: 4, count: 1 });
    const bids = await funded.builder.get(`/api/jobs/${funded.job.id}/bids`);
    expect(bids.body.bids[0].shop.rating).toEqual({ average: 4, count: 1 });
  });
});

describe('the admin console', () => {
  it('a suspended user’s open session is refused on its next request, and they cannot sign in again', async () => {
    const user = await createUser(m.db, { role: 'builder' });
    const session = await signedIn(m.server.app, user);
    expect((await session.get('/api/auth/me')).status).toBe(200);
    expect((await session.post(`/api/admin/users/${user.id}/suspend`, { reason: 'testing' })).status).toBe(403);

    const suspended = await admin.post(`/api/admin/users/${user.id}/suspend`, { reason: 'Payment fraud reported by two shops.' });
    expect(suspended.status).toBe(200);
    expect(suspended.body.user.status).toBe('suspended');
    // The mail comes from an address that takes no replies, so it names one that does (SUPPORT_EMAIL's default) and the help page.
    const [mail] = await m.db.select().from(mailOutbox).where(and(eq(mailOutbox.template, 'account_suspended'), eq(mailOutbox.toAddress, user.email)));
    expect(mail.textBody).toContain('write to help@tenthmark.test');
    expect(mail.textBody).toMatch(/How to reach us: http\S+\/help/);
    expect(mail.textBody).not.toMatch(/reply to this/i);
    expect((await session.get('/api/auth/me')).status).toBe(401);
    expect((await session.get('/api/jobs/mine')).status).toBe(401);
    expect(await m.db.select().from(sessions).where(sql`${sessions.sess} -> 'passport' ->> 'user' = ${user.id}`)).toHaveLength(0);

    const again = await agentFor(m.server.app);
    const signIn = await again.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(403);
    expect(signIn.body.error.code).toBe('suspended');
    expect(signIn.body.error.message).toMatch(/help page/);
    expect((await again.get('/api/help/contact')).body).toEqual({ email: 'help@tenthmark.test' });
    expect((await admin.post(`/api/admin/users/${adminUser.id}/suspend`, { reason: 'myself, by mistake' })).body.error.code).toBe('cannot_suspend_self');

    expect((await admin.post(`/api/admin/users/${user.id}/reinstate`)).body.user.status).toBe('active');
    expect((await again.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD })).status).toBe(200);
  });

  it('verifying a shop shows its badge; the fee set by an admin applies to new awards only', async () => {
    const funded = await m.fundedJob();
    const [shop] = await m.db.select().from(shops).where(eq(shops.userId, funded.shopUser.id));
    const found = await admin.get(`/api/admin/shops?q=${encodeURIComponent(funded.shopUser.email)}`);
    expect(found.body.shops).toHaveLength(1);
    expect(found.body.shops[0]).toMatchObject({ id: shop.id, verified: false, payoutsReady: true });
    expect((await admin.post(`/api/admin/shops/${shop.id}/verification`, { verified: true })).body.shop.verified).toBe(true);
    expect((await funded.builder.get(`/api/shops/${shop.id}`)).body.shop.verified).toBe(true);
    expect((await funded.builder.get(`/api/jobs/${funded.job.id}/bids`)).body.bids[0].shop.verified).toBe(true);

    expect((await admin.get('/api/admin/fee')).body.feeBps).toBe(800);
    expect((await admin.put('/api/admin/fee', { feeBps: 3001 })).status).toBe(400);
    const changed = await admin.put('/api/admin/fee', { feeBps: 650 });
    expect(changed.body).toMatchObject({ feeBps: 650, updatedBy: adminUser.displayName });
    // The job awarded before the change keeps its fee; the next award takes the new one.
    expect((await m.db.select({ feeBps: jobs.feeBps }).from(jobs).where(eq(jobs.id, funded.job.id)))[0].feeBps).toBe(800);
    const next = await m.fundedJob();
    expect((await m.db.select({ feeBps: jobs.feeBps }).from(jobs).where(eq(jobs.id, next.job.id)))[0].feeBps).toBe(650);
    await admin.put('/api/admin/fee', { feeBps: 800 });

    const audit = await admin.get('/api/admin/audit?action=fee.change');
    expect(audit.body.entries[0]).toMatchObject({ action: 'fee.change', details: { fromBps: 650, toBps: 800 } });
    expect((await admin.get('/api/admin/audit?action=shop.verify')).body.entries.some((e: { targetId: string }) => e.targetId === shop.id)).toBe(true);
  });

  it('the CSV export matches the ledger rows for the same filters', async () => {
    const funded = await recordWaiting(45_000);
    await funded.builder.post(`/api/jobs/${funded.job.id}/inspection/accept`, { version: 1 });
    const page = await admin.get(`/api/admin/ledger?jobId=${funded.job.id}`);
    const rows = await m.db.select().from(ledgerEntries).where(eq(ledgerEntries.jobId, funded.job.id)).orderBy(ledgerEntries.id);
    expect(page.body.total).toBe(rows.length);
    expect(page.body.totals).toMatchObject({ paid_in: 45_000 });

    const csv = await admin.agent.get(`/api/admin/ledger.csv?jobId=${funded.job.id}`).buffer(true);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.headers['content-disposition']).toMatch(/attachment/);
    const parsed = parse(csv.text, { columns: true }) as Array<Record<string, string>>;
    expect(parsed.map((r) => [Number(r.id), r.kind, Number(r.amount_cents), r.reference, r.job_id])).toEqual(rows.map((r) => [r.id, r.kind, r.amountCents, r.reference, r.jobId]));

    const all = await admin.agent.get('/api/admin/ledger.csv?kind=fee').buffer(true);
    const feeRows = await m.db.select().from(ledgerEntries).where(eq(ledgerEntries.kind, 'fee'));
    expect((parse(all.text, { columns: true }) as unknown[]).length).toBe(feeRows.length);
    expect((await funded.builder.get('/api/admin/ledger.csv')).status).toBe(403);
    expect((await admin.get('/api/admin/ledger?from=yesterday')).status).toBe(400);
  });

  it('when a job title a builder typed starts like a formula, then the CSV cell is guarded and the amounts stay numbers', async () => {
    const builderUser = await createUser(m.db);
    const builder = await signedIn(m.server.app, builderUser);
    const titles = ['=HYPERLINK("http://elsewhere.example/","Invoice")', '@SUM(1) on the deck', '-2+3 overbore', '+1 oversize pistons'];
    const jobIds: string[] = [];
    for (const title of titles) {
      const created = await builder.post('/api/jobs', jobInput({ title }));
      expect(created.status).toBe(201);
      jobIds.push(created.body.job.id);
    }
    // Straight into the ledger: a provider reference that also starts like a formula, beside an app-written amount.
    await m.db.insert(ledgerEntries).values(jobIds.map((jobId, i) => ({ jobId, kind: 'paid_in' as const, amountCents: 1500 + i, reference: i === 0 ? '=1+1' : `csv-guard-${jobId}` })));

    for (const [i, jobId] of jobIds.entries()) {
      const csv = await admin.agent.get(`/api/admin/ledger.csv?jobId=${jobId}`).buffer(true);
      const [row] = parse(csv.text, { columns: true }) as Array<Record<string, string>>;
      expect(row.job_title).toBe(`'${titles[i]}`);
      expect(row.amount_cents).toBe(String(1500 + i));
      expect(row.amount).toBe(((1500 + i) / 100).toFixed(2));
      expect(row.reference).toBe(i === 0 ? "'=1+1" : `csv-guard-${jobId}`);
      expect(row.job_id).toBe(jobId);
    }
  });
});
