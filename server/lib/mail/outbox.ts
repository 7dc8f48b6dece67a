import { and, eq, lte, sql } from 'drizzle-orm';
import type { Transporter } from 'nodemailer';
import type { Logger } from 'pino';
import { mailTopicOf, mailTopics } from '../../../shared/notifications';
import type { Database, Executor } from '../../db/client';
import { mailOutbox, notificationPreferences, users } from '../../db/schema';
import type { RenderedMail } from './templates';

/**
 * Writes a mail into the outbox. Call it with the transaction that makes the
 * change the mail is about, so the mail exists exactly when the change does.
 * A mail of an optional kind (shared/notifications.ts) that its reader turned
 * off is kept as `skipped` and never sent; every other mail goes.
 */
export async function enqueueMail(db: Executor, to: string, mail: RenderedMail): Promise<string> {
  // Kept, not sent, when the person turned this kind off, or closed the account (its address no longer reaches anyone).
  const status = (await closedAccount(db, to)) || (await turnedOff(db, to, mail.template)) ? 'skipped' : 'pending';
  const [row] = await db
    .insert(mailOutbox)
    .values({ toAddress: to, subject: mail.subject, textBody: mail.text, htmlBody: mail.html, template: mail.template, status })
    .returning({ id: mailOutbox.id });
  return row.id;
}

/** Whether the address is a closed account's. */
async function closedAccount(db: Executor, to: string): Promise<boolean> {
  const [row] = await db.select({ status: users.status }).from(users).where(sql`lower(${users.email}) = lower(${to})`).limit(1);
  return row?.status === 'closed';
}

/** Whether the account at this address turned off the optional kind of mail this template belongs to. */
async function turnedOff(db: Executor, to: string, template: string): Promise<boolean> {
  const topic = mailTopicOf(template);
  if (!topic || !mailTopics[topic].optional) return false;
  const [choice] = await db
    .select({ email: notificationPreferences.email })
    .from(notificationPreferences)
    .innerJoin(users, eq(users.id, notificationPreferences.userId))
    .where(and(sql`lower(${users.email}) = lower(${to})`, eq(notificationPreferences.kind, topic)));
  return choice?.email === false;
}

export interface OutboxWorkerOptions {
  db: Database;
  transport: Transporter;
  from: string;
  logger?: Logger;
  /** First retry delay; each further attempt doubles it, up to maxDelayMs. */
  baseDelayMs?: number;
  maxDelayMs?: number;
  /** After this many failed attempts the mail is marked failed and left for a person. */
  maxAttempts?: number;
  batchSize?: number;
}

export function retryDelayMs(attempts: number, baseDelayMs: number, maxDelayMs: number): number {
  return Math.min(maxDelayMs, baseDelayMs * 2 ** Math.max(0, attempts - 1));
}

/**
 * Sends due mail. Each row is locked (FOR UPDATE SKIP LOCKED) while it is sent,
 * so two app instances never send the same mail; a failure schedules a retry
 * with exponential backoff instead of losing the mail. The outbox id is the
 * Message-ID, so a receiving system can recognise a repeat after a crash.
 */
export function createOutboxWorker(options: OutboxWorkerOptions) {
  const baseDelayMs = options.baseDelayMs ?? 5_000;
  const maxDelayMs = options.maxDelayMs ?? 15 * 60_000;
  const maxAttempts = options.maxAttempts ?? 12;
  const batchSize = options.batchSize ?? 10;
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<number> | undefined;

  async function sendOne(now: Date | undefined): Promise<boolean> {
    // Without a given time, the database's clock decides what is due (the rows were stamped by it, to the microsecond).
    const at = now ? sql`${now.toISOString()}::timestamptz` : sql`now()`;
    return options.db.transaction(async (tx) => {
      const [mail] = await tx
        .select()
        .from(mailOutbox)
        .where(and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, at)))
        .orderBy(mailOutbox.nextAttemptAt)
        .limit(1)
        .for('update', { skipLocked: true });
      if (!mail) return false;
      try {
        await options.transport.sendMail({
          from: options.from,
          to: mail.toAddress,
          subject: mail.subject,
          text: mail.textBody,
          html: mail.htmlBody,
          messageId: `<${mail.id}@tenthmark.mail>`,
        });
        await tx
          .update(mailOutbox)
          .set({ status: 'sent', sentAt: new Date(), attempts: mail.attempts + 1, lastError: null })
          .where(eq(mailOutbox.id, mail.id));
        options.logger?.info({ mailId: mail.id, template: mail.template }, 'mail sent');
      } catch (error) {
        const attempts = mail.attempts + 1;
        const message = error instanceof Error ? error.message : String(error);
        await tx
          .update(mailOutbox)
          .set({
            attempts,
            lastError: message.slice(0, 1000),
            status: attempts >= maxAttempts ? 'failed' : 'pending',
            nextAttemptAt: sql`${at} + ${retryDelayMs(attempts, baseDelayMs, maxDelayMs)} * interval '1 millisecond'`,
          })
          .where(eq(mailOutbox.id, mail.id));
        options.logger?.warn({ mailId: mail.id, attempts, err: message }, 'mail not sent; will retry');
      }
      return true;
    });
  }

  /** Sends every mail due at `now` (the database's clock when not given); resolves to the number of mails tried. */
  async function processDue(now?: Date): Promise<number> {
    let tried = 0;
    while (tried < batchSize * 10 && (await sendOne(now))) tried += 1;
    return tried;
  }

  function tick() {
    running ??= processDue()
      .catch((error) => {
        options.logger?.warn({ err: error }, 'mail outbox pass failed');
        return 0;
      })
      .finally(() => {
        running = undefined;
      });
    return running;
  }

  return {
    processDue,
    start(intervalMs = 1_000) {
      if (timer) return;
      timer = setInterval(() => void tick(), intervalMs);
      timer.unref();
      void tick();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = undefined;
      await running;
    },
  };
}

export type OutboxWorker = ReturnType<typeof createOutboxWorker>;
