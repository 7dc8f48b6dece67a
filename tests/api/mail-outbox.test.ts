import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox } from '../../server/db/schema';
import { startMaildev } from '../../server/dev/maildev';
import { createOutboxWorker, enqueueMail, retryDelayMs } from '../../server/lib/mail/outbox';
import { passwordResetMail } from '../../server/lib/mail/templates';
import { createTransport } from '../../server/lib/mail/transport';
import { uniqueEmail } from '../factories';
import { freePort } from '../setup/ports';
import { setupTestApp, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

interface MaildevMail {
  subject: string;
  to: Array<{ address: string }>;
  text: string;
  html: string;
}

async function inbox(webUrl: string, to: string): Promise<MaildevMail[]> {
  const res = await fetch(`${webUrl}/api/email`);
  const all = (await res.json()) as MaildevMail[];
  return all.filter((m) => m.to.some((t) => t.address === to));
}

/** maildev files a mail a moment after SMTP accepts it: wait until `count` arrived (or time runs out), then a little more. */
async function settledInbox(webUrl: string, to: string, count: number): Promise<MaildevMail[]> {
  const deadline = Date.now() + 5_000;
  let mails = await inbox(webUrl, to);
  while (mails.length < count && Date.now() < deadline) {
    await new Promise((r) => setTimeout(r, 50));
    mails = await inbox(webUrl, to);
  }
  await new Promise((r) => setTimeout(r, 200));
  return inbox(webUrl, to);
}

describe('mail outbox', () => {
  it('when SMTP is down, then the mail stays queued with a retry time; when SMTP is back, it is delivered exactly once', async () => {
    const smtpPort = await freePort(); // nothing listens here yet: SMTP is down
    const webPort = await freePort();
    const transport = createTransport({ host: '127.0.0.1', port: smtpPort, secure: false });
    const worker = createOutboxWorker({ db: ctx.db, transport, from: 'Tenthmark <no-reply@tenthmark.test>', baseDelayMs: 60_000 });

    const to = uniqueEmail('outbox');
    const id = await enqueueMail(ctx.db, to, passwordResetMail({ displayName: 'Ida Quarrel', url: 'http://localhost/reset?token=abc', minutes: 60 }));

    const firstPass = new Date(Date.now() + 1_000); // safely after the row's own timestamp
    expect(await worker.processDue(firstPass)).toBeGreaterThanOrEqual(1);
    let [row] = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.id, id));
    expect(row.status).toBe('pending');
    expect(row.attempts).toBe(1);
    expect(row.lastError).toBeTruthy();
    expect(row.nextAttemptAt.getTime()).toBeGreaterThanOrEqual(firstPass.getTime() + 59_000);

    // Not due yet: a pass now does not touch it.
    await worker.processDue(new Date(firstPass.getTime() + 1_000));
    [row] = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.id, id));
    expect(row.attempts).toBe(1);

    const maildev = await startMaildev({ smtpPort, webPort });
    try {
      const later = new Date(firstPass.getTime() + 61_000);
      await worker.processDue(later);
      [row] = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.id, id));
      expect(row.status).toBe('sent');
      expect(row.attempts).toBe(2);

      // Further passes, even concurrent ones, never send it again.
      await Promise.all([worker.processDue(later), worker.processDue(new Date(later.getTime() + 3_600_000))]);
      const received = await settledInbox(maildev.webUrl, to, 1);
      expect(received).toHaveLength(1);
      expect(received[0].subject).toBe('Choose a new Tenthmark password');
      expect(received[0].text).toContain('http://localhost/reset?token=abc');
      expect(received[0].html).toContain('Choose a new password');
    } finally {
      await worker.stop();
      transport.close();
      await maildev.stop();
    }
  });

  it('when two workers run at once, then each due mail is sent once', async () => {
    const smtpPort = await freePort();
    const maildev = await startMaildev({ smtpPort, webPort: await freePort() });
    const transports = [0, 1].map(() => createTransport({ host: '127.0.0.1', port: smtpPort, secure: false }));
    const workers = transports.map((transport) => createOutboxWorker({ db: ctx.db, transport, from: 'Tenthmark <no-reply@tenthmark.test>' }));
    try {
      const to = uniqueEmail('pair');
      for (let i = 0; i < 6; i += 1) {
        await enqueueMail(ctx.db, to, passwordResetMail({ displayName: `Mail ${i}`, url: `http://localhost/${i}`, minutes: 60 }));
      }
      await Promise.all(workers.map((w) => w.processDue()));
      const rows = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, to));
      expect(rows.map((r) => [r.status, r.attempts])).toEqual(Array(6).fill(['sent', 1]));
      const received = await settledInbox(maildev.webUrl, to, 6);
      expect(received).toHaveLength(6);
      expect(new Set(received.map((m) => m.text)).size).toBe(6);
    } finally {
      transports.forEach((t) => t.close());
      await maildev.stop();
    }
  });

  it('when attempts grow, then the delay doubles up to the ceiling', () => {
    // derived: base · 2^(attempts − 1), capped
    expect([1, 2, 3, 4].map((n) => retryDelayMs(n, 1_000, 5_000))).toEqual([1_000, 2_000, 4_000, 5_000]);
  });
});
