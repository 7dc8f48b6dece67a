import { and, eq } from 'drizzle-orm';
import { addWorkingDays, dueDayEnd } from '../../shared/due-day';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inspectionRecords, mailOutbox } from '../../server/db/schema';
import { timeLeftText } from '../../server/modules/notifications/needs-you';
import { createUser, uniformRecordInput } from '../factories';
import { payOnPage } from '../setup/payments';
import { startMoneyApp } from '../setup/money-app';
import { signedIn } from '../setup/test-env';

let m: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  m = await startMoneyApp();
});
afterAll(async () => {
  await m?.close();
});

type Client = Awaited<ReturnType<typeof signedIn>>;
interface Notice {
  id: string;
  kind: string;
  jobId: string | null;
  text: string;
  href: string;
  readAt: string | null;
}
interface Item {
  kind: string;
  jobId: string;
  dueAt: string | null;
  text: string;
  href: string;
}

const noticesOf = async (client: Client) => (await client.get('/api/notifications')).body as { notifications: Notice[]; unread: number; nextCursor: string | null };
const needsYouOf = async (client: Client) => ((await client.get('/api/me/needs-you')).body as { items: Item[] }).items;
/** The outbox rows written to this address with this template. */
const mailsTo = (address: string, template: string) =>
  m.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, address), eq(mailOutbox.template, template)));

describe('needs you and the notification centre', () => {
  it('when the shop submits a record, then the builder has "results to review" with the window’s end and a notice; the shop does not', async () => {
    const { job, builder, shop } = await m.jobIn('submitted');
    const [record] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));

    const items = await needsYouOf(builder);
    const review = items.find((item) => item.kind === 'results-to-review');
    expect(review).toMatchObject({ jobId: job.id, href: `/jobs/${job.id}`, dueAt: record.reviewDueAt.toISOString() });
    expect(review!.text).toMatch(/days? .*left/);
    expect((await needsYouOf(shop)).some((item) => item.kind === 'results-to-review')).toBe(false);

    const page = await noticesOf(builder);
    const notice = page.notifications.find((n) => n.kind === 'results_submitted');
    expect(notice).toMatchObject({ jobId: job.id, href: `/jobs/${job.id}`, readAt: null });
    expect(notice!.text).toContain(job.title);
    // The bid that came in and the payment held are notices too, newest first.
    expect(page.notifications.map((n) => n.kind)).toEqual(['results_submitted', 'payment_held', 'bid_received']);
    expect(page.unread).toBe(page.notifications.length);
    expect((await noticesOf(shop)).notifications.map((n) => n.kind)).toEqual(expect.arrayContaining(['bid_accepted', 'payment_held']));
  });

  it('when the person reads one notice or all, then the unread count follows; someone else’s notice is not found', async () => {
    const { builder, shop } = await m.jobIn('submitted');
    const before = await noticesOf(builder);
    expect(before.unread).toBeGreaterThanOrEqual(2);
    const first = before.notifications[0];

    expect((await shop.post(`/api/notifications/${first.id}/read`)).status).toBe(404);
    const stranger = await signedIn(m.server.app, await createUser(m.db));
    expect((await stranger.post(`/api/notifications/${first.id}/read`)).status).toBe(404);
    expect((await noticesOf(builder)).unread).toBe(before.unread);

    const read = await builder.post(`/api/notifications/${first.id}/read`);
    expect(read.status).toBe(200);
    expect(read.body.notification.readAt).not.toBeNull();
    expect((await builder.get('/api/notifications/unread')).body.unread).toBe(before.unread - 1);

    expect((await builder.post('/api/notifications/read-all')).body.unread).toBe(0);
    const after = await noticesOf(builder);
    expect(after.unread).toBe(0);
    expect(after.notifications.every((n) => n.readAt !== null)).toBe(true);
    // The shop's own notices are untouched.
    expect((await noticesOf(shop)).unread).toBeGreaterThan(0);
  });

  it('when a shop’s agreed finish is near and the builder asks for changes, then the shop’s list says so', async () => {
    // One working day from the parts' arrival today: due within three calendar days whatever today's weekday (Friday → Monday).
    const { job, builder, shop } = await m.jobIn('submitted', { bid: { turnaroundDays: 1 } });
    expect((await builder.post(`/api/jobs/${job.id}/inspection/reject`, { version: 1, reasons: 'Cylinder three reads high at the bottom.' })).status).toBe(200);
    const items = await needsYouOf(shop);
    expect(items.find((item) => item.kind === 'record-rejected')).toMatchObject({ jobId: job.id });
    const due = items.find((item) => item.kind === 'jobs-coming-due');
    expect(due).toMatchObject({ jobId: job.id });
    // The end of the due day (UTC), by the one rule of shared/due-day.ts.
    expect(due!.dueAt).toBe(dueDayEnd(addWorkingDays(new Date(), 1)).toISOString());
    expect((await noticesOf(shop)).notifications[0]).toMatchObject({ kind: 'record_rejected', jobId: job.id });
  });

  it('when the builder opens a dispute, then the shop must give its side, the admin must decide, and once answered the builder is told', async () => {
    const admin = await signedIn(m.server.app, await createUser(m.db, { role: 'admin' }));
    const { job, builder, shop, dispute } = await m.jobIn('disputed');
    expect((await needsYouOf(shop)).find((item) => item.jobId === job.id)).toMatchObject({ kind: 'dispute-waiting', text: expect.stringMatching(/builder opened a dispute: give your side/) });
    expect((await needsYouOf(builder)).some((item) => item.jobId === job.id)).toBe(false);
    expect((await needsYouOf(admin)).find((item) => item.jobId === job.id)).toMatchObject({ kind: 'dispute-to-decide', href: `/admin/disputes/${dispute!.id}` });
    expect((await noticesOf(shop)).notifications[0]).toMatchObject({ kind: 'dispute_opened', jobId: job.id });
    expect((await noticesOf(admin)).notifications.find((n) => n.jobId === job.id)).toMatchObject({ kind: 'dispute_opened', href: `/admin/disputes/${dispute!.id}` });

    expect((await shop.post(`/api/jobs/${job.id}/dispute/response`, { statement: 'Our gauge was checked against a ring that morning.' })).status).toBe(200);
    expect((await needsYouOf(shop)).some((item) => item.jobId === job.id)).toBe(false);
    expect((await needsYouOf(builder)).find((item) => item.jobId === job.id)).toMatchObject({ kind: 'dispute-waiting', text: expect.stringMatching(/shop answered your dispute/) });
    expect((await noticesOf(builder)).notifications[0]).toMatchObject({ kind: 'dispute_answered', jobId: job.id });
  });
});

describe('e-mail choices', () => {
  it('when the builder turned off results mail, then the record sends no mail but the notice still comes', async () => {
    const { job, builder, builderUser, shop } = await m.jobIn('inWork');
    const choices = await builder.put('/api/me/notification-preferences', { preferences: [{ kind: 'results_to_review', email: false }] });
    expect(choices.status).toBe(200);
    expect(choices.body.preferences.find((p: { kind: string }) => p.kind === 'results_to_review')).toMatchObject({ email: false, canTurnOff: true });

    expect((await shop.post(`/api/jobs/${job.id}/inspection`, uniformRecordInput())).status).toBe(201);
    const mails = await mailsTo(builderUser.email, 'inspection_submitted');
    expect(mails.map((mail) => mail.status)).toEqual(['skipped']);
    expect((await noticesOf(builder)).notifications[0]).toMatchObject({ kind: 'results_submitted', jobId: job.id });
    // A skipped mail is never picked up by the worker.
    await new Promise((resolve) => setTimeout(resolve, 1_500));
    expect((await mailsTo(builderUser.email, 'inspection_submitted')).map((mail) => mail.status)).toEqual(['skipped']);
  });

  it('when the builder tries to turn off receipts, then the choice is refused as "always sent" and the payment receipt goes', async () => {
    const { job, builder, builderUser } = await m.jobIn('awarded');
    const everythingOff = (await builder.get('/api/me/notification-preferences')).body.preferences.map((p: { kind: string }) => ({ kind: p.kind, email: false }));
    const saved = await builder.put('/api/me/notification-preferences', { preferences: everythingOff });
    expect(saved.status).toBe(200);
    const receipts = saved.body.preferences.find((p: { kind: string }) => p.kind === 'money_receipts');
    expect(receipts).toMatchObject({ email: true, canTurnOff: false });

    const { url } = (await builder.post(`/api/jobs/${job.id}/checkout`)).body;
    expect((await payOnPage(url, '4242424242424242')).status).toBeLessThan(400);
    const sent = await m.until(
      'the receipt sent',
      async () => {
        const rows = await mailsTo(builderUser.email, 'payment_receipt');
        return rows.length === 1 && rows[0].status === 'sent' ? rows : undefined;
      },
      15_000,
    );
    expect(sent).toHaveLength(1);
    expect((await noticesOf(builder)).notifications[0]).toMatchObject({ kind: 'payment_held', jobId: job.id });
  });

  it('when a choice names no kind of notice, then it is refused with the field named', async () => {
    const builder = await signedIn(m.server.app, await createUser(m.db));
    const res = await builder.put('/api/me/notification-preferences', { preferences: [{ kind: 'everything', email: false }] });
    expect(res.status).toBe(400);
  });
});

describe('time left', () => {
  // Common practice: whole days and hours, rounded down, as a countdown reads.
  it.each([
    [2 * 24 * 60 + 5 * 60 + 30, '2 days 5 hours left'],
    [24 * 60, '1 day left'],
    [3 * 60, '3 hours left'],
    [40, '40 minutes left'],
    [-(25 * 60), '1 day 1 hour overdue'],
  ])('when %i minutes remain, then it reads "%s"', (minutes, text) => {
    const now = new Date('2026-03-01T12:00:00Z');
    expect(timeLeftText(new Date(now.getTime() + minutes * 60_000), now)).toBe(text);
  });
});
