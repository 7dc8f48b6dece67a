import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createOutboxWorker } from '../../server/lib/mail/outbox';
import { createTransport } from '../../server/lib/mail/transport';
import { bidInput, createJob, createShop, createUser, jobInput } from '../factories';
import { setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

async function inboxOf(address: string, expected: number) {
  const deadline = Date.now() + 8_000;
  for (;;) {
    const res = await fetch(`${inject('maildevUrl')}/api/email`);
    const mails = ((await res.json()) as Array<{ subject: string; text: string; to: Array<{ address: string }> }>).filter((m) =>
      m.to.some((t) => t.address === address),
    );
    if (mails.length >= expected || Date.now() > deadline) return mails.map((m) => m.subject).sort();
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('marketplace e-mail, delivered over SMTP into maildev', () => {
  it('when a job is published, bid on, changed, and a bid accepted, then every party gets its mail', async () => {
    const watcher = await createShop(ctx.db, { notifyMatchingJobs: true, capabilities: ['bore', 'hone'], rateCard: [] });
    const winner = await createShop(ctx.db);
    const loser = await createShop(ctx.db);
    const builder = await createUser(ctx.db);
    const job = await createJob(ctx.db, builder.id, { status: 'draft', input: { title: 'Mail journey block' } });

    const b = await signedIn(ctx.app, builder);
    await b.post(`/api/jobs/${job.id}/publish`);
    const w = await signedIn(ctx.app, winner.user);
    const l = await signedIn(ctx.app, loser.user);
    const winning = (await w.post(`/api/jobs/${job.id}/bids`, bidInput())).body.bid.id;
    await l.post(`/api/jobs/${job.id}/bids`, bidInput({ turnaroundDays: 20 }));
    await b.agent.put(`/api/jobs/${job.id}`).set('X-CSRF-Token', b.token).send(jobInput({ title: 'Mail journey block', notes: 'Please keep the old pistons.' }));
    expect((await b.post(`/api/bids/${winning}/accept`)).status).toBe(200);

    const transport = createTransport({ host: '127.0.0.1', port: inject('smtpPort'), secure: false });
    const worker = createOutboxWorker({ db: ctx.db, transport, from: 'Tenthmark <no-reply@tenthmark.test>' });
    try {
      expect(await worker.processDue()).toBe(7); // 1 matching job, 2 new bids, 2 job changed, 1 accepted, 1 declined
    } finally {
      transport.close();
    }

    expect(await inboxOf(watcher.user.email, 1)).toEqual(['A new job that fits your shop: “Mail journey block”']);
    expect(await inboxOf(builder.email, 2)).toEqual(['New bid on “Mail journey block”', 'New bid on “Mail journey block”']);
    expect(await inboxOf(winner.user.email, 2)).toEqual(['Your bid on “Mail journey block” was accepted', '“Mail journey block” was changed']);
    expect(await inboxOf(loser.user.email, 2)).toEqual(['Your bid on “Mail journey block” was not chosen', '“Mail journey block” was changed']);
  });
});
