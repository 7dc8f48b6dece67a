import { and, eq, isNull, sql } from 'drizzle-orm';
import type { Database, Executor } from '../../db/client';
import { payments, scheduledTasks } from '../../db/schema';
import type { PaymentsClient } from '../../lib/payments-client';
import { scheduleTask } from '../../lib/scheduler';

/**
 * Payment pages (Checkout Sessions) that are no longer wanted: the job was
 * cancelled or its money settled, a change order was declined, or a newer page
 * replaced the payment's old one. The change that ends the need marks the
 * payments and schedules one task per page in its own transaction; right after
 * it commits the page is expired at the provider, and if the provider is away
 * the task runner tries again until it is. A page paid in spite of all this is
 * refunded when its webhook arrives (see applyCheckoutSession).
 */

export const EXPIRE_CHECKOUT_TASK = 'expire-checkout';

/** The task runner's retry waits this long, so the attempt right after the commit normally does it alone. */
const TASK_DELAY_MS = 60_000;

const taskKey = (sessionId: string) => `expire-checkout-${sessionId}`;

/** Remembers (in the caller's transaction) that the page must be expired at the provider. */
export async function scheduleCheckoutExpiry(tx: Executor, jobId: string, sessionId: string): Promise<void> {
  await scheduleTask(tx, { kind: EXPIRE_CHECKOUT_TASK, key: taskKey(sessionId), payload: { sessionId, jobId }, runAt: new Date(Date.now() + TASK_DELAY_MS) });
}

/**
 * In the transaction that ends the need: the waiting payments of a job (or of
 * one change order) stop waiting, and each open page gets its expiry task.
 * Call expireOpenCheckouts after the commit.
 */
export async function closeOpenCheckouts(tx: Executor, scope: { jobId: string; changeOrderId?: string }): Promise<void> {
  const closed = await tx
    .update(payments)
    .set({ status: 'expired' })
    .where(and(eq(payments.jobId, scope.jobId), scope.changeOrderId ? eq(payments.changeOrderId, scope.changeOrderId) : undefined, eq(payments.status, 'pending')))
    .returning({ sessionId: payments.checkoutSessionId });
  for (const { sessionId } of closed) if (sessionId) await scheduleCheckoutExpiry(tx, scope.jobId, sessionId);
}

/**
 * Expires one page. A page that is no longer open (paid, or already expired)
 * needs nothing more: a payment that got through is the webhook's business.
 * Throws when the provider cannot be asked.
 */
export async function expireCheckoutSession(client: PaymentsClient, sessionId: string): Promise<void> {
  try {
    await client.checkout.sessions.expire(sessionId, {}, { idempotencyKey: `expire-${sessionId}` });
  } catch (error) {
    let status: string | null;
    try {
      status = (await client.checkout.sessions.retrieve(sessionId)).status;
    } catch {
      throw error;
    }
    if (status === 'open') throw error;
  }
}

/**
 * After the commit: expires the job's pages still waiting for it, now. What
 * fails stays scheduled and the task runner retries it; this never throws, so
 * the change that was made is answered as made.
 */
export async function expireOpenCheckouts(deps: { db: Database; payments: PaymentsClient }, jobId: string): Promise<void> {
  try {
    const due = await deps.db
      .select({ key: scheduledTasks.key, payload: scheduledTasks.payload })
      .from(scheduledTasks)
      .where(and(eq(scheduledTasks.kind, EXPIRE_CHECKOUT_TASK), isNull(scheduledTasks.doneAt), sql`${scheduledTasks.payload}->>'jobId' = ${jobId}`));
    for (const task of due) {
      const { sessionId } = task.payload as { sessionId: string };
      try {
        await expireCheckoutSession(deps.payments, sessionId);
        await deps.db.update(scheduledTasks).set({ doneAt: new Date(), lastError: null }).where(and(eq(scheduledTasks.key, task.key), isNull(scheduledTasks.doneAt)));
      } catch (error) {
        await deps.db
          .update(scheduledTasks)
          .set({ lastError: String(error).slice(0, 500) })
          .where(eq(scheduledTasks.key, task.key))
          .catch(() => {});
      }
    }
  } catch {
    // The database itself is away: the scheduled tasks are still there for the task runner.
  }
}

/** The task runner's handler: expires the page, or fails so it is tried again when its lease ends. */
export function checkoutTaskHandlers(deps: { payments: PaymentsClient }) {
  return {
    [EXPIRE_CHECKOUT_TASK]: async (payload: Record<string, unknown>) => expireCheckoutSession(deps.payments, String(payload.sessionId)),
  };
}
