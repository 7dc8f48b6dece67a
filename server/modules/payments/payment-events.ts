import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { paymentEvents } from '../../db/schema';
import { applyAccount, applyCheckoutSession, applyPaymentFailed, type PaymentDeps } from './payments.service';

/**
 * One event from the provider's webhook (its signature already checked):
 * stored by id and applied once. Objects whose state matters are read back
 * from the API, so events may come in any order or more than once. A throw
 * leaves the event unapplied, so the provider's next delivery applies it.
 */
export async function applyPaymentEvent(deps: PaymentDeps, event: Stripe.Event): Promise<{ duplicate: boolean }> {
  await deps.db.insert(paymentEvents).values({ id: event.id, type: event.type, payload: event }).onConflictDoNothing();
  const [stored] = await deps.db.select().from(paymentEvents).where(eq(paymentEvents.id, event.id));
  if (stored.appliedAt) return { duplicate: true };

  const object = event.data.object as unknown as { id: string; object: string };
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.expired':
      await applyCheckoutSession(deps, object.id);
      break;
    case 'payment_intent.succeeded': {
      // The session carries the job; find it through the intent's metadata and read it back.
      const sessions = await deps.payments.checkout.sessions.list({ payment_intent: object.id, limit: 1 });
      if (sessions.data[0]) await applyCheckoutSession(deps, sessions.data[0].id);
      break;
    }
    case 'payment_intent.payment_failed':
      await applyPaymentFailed(deps, await deps.payments.paymentIntents.retrieve(object.id));
      break;
    case 'account.updated':
    case 'capability.updated': {
      const accountId = event.type === 'account.updated' ? object.id : (event.account ?? (event.data.object as Stripe.Capability).account);
      await applyAccount(deps.db, await deps.payments.accounts.retrieve(String(accountId)));
      break;
    }
    default:
      break; // stored, nothing to apply
  }
  await deps.db.update(paymentEvents).set({ appliedAt: new Date() }).where(eq(paymentEvents.id, event.id));
  return { duplicate: false };
}
