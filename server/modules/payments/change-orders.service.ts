import { and, asc, eq, inArray } from 'drizzle-orm';
import type { ChangeOrder, ChangeOrderInput } from '../../../shared/schemas/payments';
import { changeOrders, payments, type User } from '../../db/schema';
import { assertEmailConfirmed } from '../../lib/auth/guards';
import { conflict, notFound } from '../../lib/errors';
import { mustBeAwardedShop, mustBeBuilder, workPartiesFor } from '../jobs/job-access';
import { findJob } from '../jobs/jobs.repository';
import { findShopByUser } from '../shops/shops.repository';
import { closeOpenCheckouts, expireOpenCheckouts } from './open-checkouts';
import { startChangeOrderCheckout, type PaymentDeps } from './payments.service';

const toView = (row: typeof changeOrders.$inferSelect): ChangeOrder => ({
  id: row.id,
  jobId: row.jobId,
  description: row.description,
  amountCents: row.amountCents,
  status: row.status,
  createdAt: row.createdAt.toISOString(),
});

/** The awarded shop proposes extra work, with a price, while the job is paid for or under way. */
export async function proposeChangeOrder(deps: PaymentDeps, user: User, jobId: string, input: ChangeOrderInput): Promise<ChangeOrder> {
  const job = await findJob(deps.db, jobId);
  const shop = await findShopByUser(deps.db, user.id);
  if (!job || !shop) throw notFound('No job with that id.');
  await mustBeAwardedShop(deps.db, job, shop.id, 'Only the shop doing the work proposes extra work.');
  if (!['funded', 'in_work'].includes(job.status)) throw conflict('Extra work can be proposed once the job is paid for and before the inspection.', 'job_not_in_work');
  const [row] = await deps.db.insert(changeOrders).values({ jobId, shopId: shop.id, description: input.description, amountCents: input.amountCents }).returning();
  deps.hub?.jobChanged(jobId, 'job_updated');
  return toView(row);
}

/** Like the job's money: its builder, the shop doing the work and admins (not every shop that once bid). */
export async function changeOrdersFor(deps: PaymentDeps, user: User, jobId: string): Promise<ChangeOrder[]> {
  await workPartiesFor(deps.db, jobId, user);
  const rows = await deps.db.select().from(changeOrders).where(eq(changeOrders.jobId, jobId)).orderBy(asc(changeOrders.createdAt));
  return rows.map(toView);
}

async function builderChangeOrder(deps: PaymentDeps, user: User, id: string) {
  const [row] = await deps.db.select().from(changeOrders).where(eq(changeOrders.id, id));
  const job = mustBeBuilder(row ? await findJob(deps.db, row.jobId) : undefined, user, 'No extra work with that id.');
  return { row, job };
}

/** The builder agrees and pays the difference: a second checkout in the job's transfer group. */
export async function approveChangeOrder(deps: PaymentDeps, user: User, id: string): Promise<{ url: string }> {
  assertEmailConfirmed(user, 'pay');
  const { row, job } = await builderChangeOrder(deps, user, id);
  if (!['proposed', 'approved'].includes(row.status)) throw conflict('This extra work is already answered.', 'change_order_settled');
  if (!['funded', 'in_work'].includes(job.status)) throw conflict('The job is past the point where extra work can be paid for.', 'job_not_in_work');
  await deps.db.update(changeOrders).set({ status: 'approved', decidedAt: new Date() }).where(eq(changeOrders.id, row.id));
  return startChangeOrderCheckout(deps, job, row);
}

/**
 * The builder says no to extra work: while it is proposed, or agreed but not
 * yet paid (its payment page is then expired; a payment that still gets
 * through is refunded when it arrives).
 */
export async function declineChangeOrder(deps: PaymentDeps, user: User, id: string): Promise<ChangeOrder> {
  const { row } = await builderChangeOrder(deps, user, id);
  const updated = await deps.db.transaction(async (tx) => {
    // The job's lock first, as a payment arriving for this change order takes it.
    await findJob(tx, row.jobId, { forUpdate: true });
    const [current] = await tx.select().from(changeOrders).where(eq(changeOrders.id, row.id)).for('update');
    if (!['proposed', 'approved'].includes(current.status)) throw conflict('Only extra work that is not paid can be declined.', 'change_order_settled');
    const paid = await tx.select({ id: payments.id }).from(payments).where(and(eq(payments.changeOrderId, row.id), inArray(payments.status, ['paid'])));
    if (paid.length) throw conflict('This extra work is paid.', 'change_order_settled');
    const [declined] = await tx.update(changeOrders).set({ status: 'declined', decidedAt: new Date() }).where(eq(changeOrders.id, row.id)).returning();
    await closeOpenCheckouts(tx, { jobId: row.jobId, changeOrderId: row.id });
    return declined;
  });
  await expireOpenCheckouts(deps, row.jobId);
  return toView(updated);
}
