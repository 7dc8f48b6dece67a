import { and, count, desc, eq, gte, ilike, isNotNull, isNull, lt, ne, or, sql, type SQL } from 'drizzle-orm';
import type { AdminShopRow, AdminUserRow, LedgerPage, LedgerQuery, ShopSearchInput } from '../../../shared/schemas/admin';
import type { Database, Executor } from '../../db/client';
import { jobs, ledgerEntries, sessions, shops, users, type User } from '../../db/schema';
import { csvDecimal, csvStringifier } from '../../lib/csv';
import { conflict, notFound } from '../../lib/errors';
import { enqueueMail } from '../../lib/mail/outbox';
import { accountSuspendedMail } from '../../lib/mail/templates';
import type { RealtimeHub } from '../../realtime/hub';
import { shopRatings } from '../reviews/ratings';
import { recordAdminAction } from './audit';
import { currentFee, setFee } from './platform-fee';

export interface ConsoleDeps {
  db: Database;
  hub?: RealtimeHub;
  defaultFeeBps: number;
  /** For mail that must say how to reach us: the help page under appUrl and the support address. */
  appUrl: string;
  supportEmail: string;
}

const escapeLike = (value: string) => `%${value.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

function toUserRow(u: User): AdminUserRow {
  return {
    id: u.id,
    email: u.email,
    displayName: u.displayName,
    role: u.role,
    status: u.status,
    emailVerifiedAt: u.emailVerifiedAt?.toISOString() ?? null,
    createdAt: u.createdAt.toISOString(),
  };
}

// ---------------------------------------------------------------------------
// People

/**
 * Suspends an account: its status changes, every session it holds is deleted
 * and its live connections are closed, so the next request it makes is
 * refused; signing in again is refused too.
 */
export async function suspendUser(deps: ConsoleDeps, admin: User, userId: string, reason: string): Promise<AdminUserRow> {
  if (userId === admin.id) throw conflict('You cannot suspend your own account.', 'cannot_suspend_self');
  const user = await deps.db.transaction(async (tx) => {
    const [row] = await tx.update(users).set({ status: 'suspended' }).where(and(eq(users.id, userId), ne(users.status, 'closed'))).returning();
    if (!row) throw notFound('No open account with that id.');
    await tx.delete(sessions).where(sql`${sessions.sess} -> 'passport' ->> 'user' = ${userId}`);
    await recordAdminAction(tx, { adminId: admin.id, action: 'user.suspend', targetType: 'user', targetId: userId, details: { email: row.email, reason } });
    await enqueueMail(tx, row.email, accountSuspendedMail({ name: row.displayName, reason, helpUrl: `${deps.appUrl}/help`, supportEmail: deps.supportEmail }));
    return row;
  });
  deps.hub?.signOut(userId);
  return toUserRow(user);
}

export async function reinstateUser(deps: ConsoleDeps, admin: User, userId: string): Promise<AdminUserRow> {
  return deps.db.transaction(async (tx) => {
    // A deleted account stays closed: it has nothing left to sign in with.
    const [row] = await tx.update(users).set({ status: 'active' }).where(and(eq(users.id, userId), ne(users.status, 'closed'))).returning();
    if (!row) throw notFound('No open account with that id.');
    await recordAdminAction(tx, { adminId: admin.id, action: 'user.reinstate', targetType: 'user', targetId: userId, details: { email: row.email } });
    return toUserRow(row);
  });
}

// ---------------------------------------------------------------------------
// Shops

async function shopRows(db: Executor, where: SQL | undefined, limit: number, offset: number): Promise<AdminShopRow[]> {
  const rows = await db
    .select({ shop: shops, email: users.email, ownerStatus: users.status })
    .from(shops)
    .innerJoin(users, eq(users.id, shops.userId))
    .where(where)
    .orderBy(shops.name, shops.id)
    .limit(limit)
    .offset(offset);
  const ratings = await shopRatings(db, rows.map((r) => r.shop.id));
  return rows.map(({ shop, email, ownerStatus }) => ({
    id: shop.id,
    userId: shop.userId,
    name: shop.name,
    email,
    city: shop.city,
    region: shop.region,
    country: shop.country,
    verified: shop.verifiedAt !== null,
    payoutsReady: shop.payoutsReadyAt !== null,
    ownerStatus,
    rating: ratings.get(shop.id) ?? null,
    createdAt: shop.createdAt.toISOString(),
  }));
}

export async function searchShopsForAdmin(db: Database, input: ShopSearchInput) {
  const filters: SQL[] = [];
  if (input.q) filters.push(or(ilike(shops.name, escapeLike(input.q)), ilike(users.email, escapeLike(input.q)), ilike(shops.city, escapeLike(input.q)))!);
  if (input.verified === 'yes') filters.push(isNotNull(shops.verifiedAt));
  if (input.verified === 'no') filters.push(isNull(shops.verifiedAt));
  const where = filters.length ? and(...filters) : undefined;
  const [rows, [{ total }]] = await Promise.all([
    shopRows(db, where, input.limit, input.offset),
    db.select({ total: count() }).from(shops).innerJoin(users, eq(users.id, shops.userId)).where(where),
  ]);
  return { shops: rows, total };
}

/** Verifying a shop shows a badge on its page and its bids; taking it away removes the badge. */
export async function setShopVerified(deps: ConsoleDeps, admin: User, shopId: string, verified: boolean): Promise<AdminShopRow> {
  return deps.db.transaction(async (tx) => {
    const [row] = await tx
      .update(shops)
      .set({ verifiedAt: verified ? sql`coalesce(${shops.verifiedAt}, now())` : null })
      .where(eq(shops.id, shopId))
      .returning({ id: shops.id, name: shops.name });
    if (!row) throw notFound('No shop with that id.');
    await recordAdminAction(tx, { adminId: admin.id, action: verified ? 'shop.verify' : 'shop.unverify', targetType: 'shop', targetId: shopId, details: { name: row.name } });
    const [shop] = await shopRows(tx, eq(shops.id, shopId), 1, 0);
    return shop;
  });
}

// ---------------------------------------------------------------------------
// The platform fee

export const platformFee = (deps: ConsoleDeps) => currentFee(deps.db, deps.defaultFeeBps);

export async function changePlatformFee(deps: ConsoleDeps, admin: User, feeBps: number) {
  await deps.db.transaction(async (tx) => {
    const before = await currentFee(tx, deps.defaultFeeBps);
    await setFee(tx, feeBps, admin.id);
    await recordAdminAction(tx, { adminId: admin.id, action: 'fee.change', targetType: 'setting', targetId: 'platform_fee_bps', details: { fromBps: before.feeBps, toBps: feeBps } });
  });
  return platformFee(deps);
}

// ---------------------------------------------------------------------------
// The ledger

function ledgerWhere(query: Omit<LedgerQuery, 'limit' | 'offset'>): SQL | undefined {
  const filters: SQL[] = [];
  if (query.kind) filters.push(eq(ledgerEntries.kind, query.kind));
  if (query.jobId) filters.push(eq(ledgerEntries.jobId, query.jobId));
  // Dates are whole days in UTC: from the start of `from` to the end of `to`.
  if (query.from) filters.push(gte(ledgerEntries.createdAt, new Date(`${query.from}T00:00:00Z`)));
  if (query.to) filters.push(lt(ledgerEntries.createdAt, new Date(new Date(`${query.to}T00:00:00Z`).getTime() + 24 * 60 * 60_000)));
  return filters.length ? and(...filters) : undefined;
}

const ledgerColumns = {
  id: ledgerEntries.id,
  createdAt: ledgerEntries.createdAt,
  jobId: ledgerEntries.jobId,
  jobTitle: jobs.title,
  kind: ledgerEntries.kind,
  amountCents: ledgerEntries.amountCents,
  reference: ledgerEntries.reference,
  paymentId: ledgerEntries.paymentId,
};

export async function ledgerPage(db: Database, query: LedgerQuery): Promise<LedgerPage> {
  const where = ledgerWhere(query);
  const [rows, [totals]] = await Promise.all([
    db.select(ledgerColumns).from(ledgerEntries).innerJoin(jobs, eq(jobs.id, ledgerEntries.jobId)).where(where).orderBy(desc(ledgerEntries.id)).limit(query.limit).offset(query.offset),
    db
      .select({
        total: sql<number>`count(*)::int`,
        paid_in: sql<number>`coalesce(sum(${ledgerEntries.amountCents}) FILTER (WHERE ${ledgerEntries.kind} = 'paid_in'), 0)::int`,
        released: sql<number>`coalesce(sum(${ledgerEntries.amountCents}) FILTER (WHERE ${ledgerEntries.kind} = 'released'), 0)::int`,
        fee: sql<number>`coalesce(sum(${ledgerEntries.amountCents}) FILTER (WHERE ${ledgerEntries.kind} = 'fee'), 0)::int`,
        refunded: sql<number>`coalesce(sum(${ledgerEntries.amountCents}) FILTER (WHERE ${ledgerEntries.kind} = 'refunded'), 0)::int`,
      })
      .from(ledgerEntries)
      .where(where),
  ]);
  const { total, ...byKind } = totals;
  return { rows: rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() })), total, totals: byKind };
}

/**
 * Every ledger row the filters match, as CSV, oldest first, streamed in pages
 * of 1,000 so a long ledger never sits in memory at once. Amounts are whole
 * cents (and dollars beside them, for people reading it in a spreadsheet);
 * text cells are guarded against formula injection (server/lib/csv.ts).
 */
export async function* ledgerCsv(db: Database, query: Omit<LedgerQuery, 'limit' | 'offset'>): AsyncGenerator<string> {
  const where = ledgerWhere(query);
  const csv = csvStringifier({ header: true, columns: ['id', 'created_at', 'job_id', 'job_title', 'kind', 'amount_cents', 'amount', 'reference', 'payment_id'] });
  const chunks: string[] = [];
  csv.on('data', (chunk: Buffer | string) => chunks.push(chunk.toString()));
  let after = 0;
  for (;;) {
    const page = await db
      .select(ledgerColumns)
      .from(ledgerEntries)
      .innerJoin(jobs, eq(jobs.id, ledgerEntries.jobId))
      .where(and(where, sql`${ledgerEntries.id} > ${after}`))
      .orderBy(ledgerEntries.id)
      .limit(1000);
    for (const r of page) {
      csv.write([r.id, r.createdAt.toISOString(), r.jobId, r.jobTitle, r.kind, r.amountCents, csvDecimal(r.amountCents / 100, 2), r.reference, r.paymentId ?? '']);
    }
    await new Promise((resolve) => setImmediate(resolve));
    if (chunks.length) yield chunks.splice(0).join('');
    if (page.length < 1000) break;
    after = page[page.length - 1].id;
  }
  await new Promise<void>((resolve) => csv.end(resolve));
  if (chunks.length) yield chunks.splice(0).join('');
}
