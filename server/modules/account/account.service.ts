import { and, eq, sql } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { bids, jobs, shops, userTokens, users, type User } from '../../db/schema';
import { csvDecimal, csvStringifier } from '../../lib/csv';
import { AppError, badRequest } from '../../lib/errors';
import { enqueueMail } from '../../lib/mail/outbox';
import { accountClosedMail, confirmNewEmailMail, emailChangedMail } from '../../lib/mail/templates';
import type { RealtimeHub } from '../../realtime/hub';
import type { AccountExport, ChangeEmailInput, DeletionCheck } from '../../../shared/schemas/account';
import { DELETED_ACCOUNT_NAME } from '../../../shared/legal';
import { emailTaken, expiredLink, proveCurrentPassword } from '../auth/auth.service';
import { consumeToken, issueToken, spendAllTokens } from '../auth/tokens';
import { deleteSessionsOfUser, findUserByEmail, findUserById, updateUser } from '../users/users.repository';
import { activeBidsOfShop, deletionBlockers, exportRows, partyJobIds, shopOfUser } from './account.repository';

export const CHANGE_EMAIL_TTL_MS = 48 * 60 * 60_000;

export interface AccountDeps {
  db: Database;
  appUrl: string;
  hub?: RealtimeHub;
}

/**
 * Asks to move the account to a new address: the current password must be
 * right and the address free. A link goes to the new address; the account
 * keeps its address until the link is followed. A newer request replaces an
 * older one (its link stops working).
 */
export async function requestEmailChange(deps: AccountDeps, user: User, input: ChangeEmailInput): Promise<string> {
  await proveCurrentPassword(user, input.currentPassword);
  if (input.newEmail.toLowerCase() === user.email.toLowerCase()) {
    throw new AppError('same_email', 'That is already your e-mail address.', 400, { newEmail: 'That is already your e-mail address.' });
  }
  if (await findUserByEmail(deps.db, input.newEmail)) throw emailTaken('newEmail');
  await deps.db.transaction(async (tx) => {
    await updateUser(tx, user.id, { pendingEmail: input.newEmail });
    await spendAllTokens(tx, user.id, 'change_email');
    const token = await issueToken(tx, user.id, 'change_email', CHANGE_EMAIL_TTL_MS);
    const url = `${deps.appUrl}/confirm-new-email?token=${token}`;
    await enqueueMail(tx, input.newEmail, confirmNewEmailMail({ displayName: user.displayName, url, hours: CHANGE_EMAIL_TTL_MS / 3_600_000 }));
  });
  return input.newEmail;
}

/**
 * Follows the link sent to the new address: the account moves to it (now
 * confirmed, since the person read mail there) and the old address is told.
 */
export async function confirmEmailChange(deps: AccountDeps, token: string): Promise<string> {
  return deps.db.transaction(async (tx) => {
    const userId = await consumeToken(tx, token, 'change_email');
    const user = userId ? await findUserById(tx, userId) : undefined;
    if (!user?.pendingEmail || user.status !== 'active') throw expiredLink();
    const newEmail = user.pendingEmail;
    const holder = await findUserByEmail(tx, newEmail);
    if (holder && holder.id !== user.id) throw emailTaken('token');
    await updateUser(tx, user.id, { email: newEmail, pendingEmail: null, emailVerifiedAt: new Date() });
    // Links sent to the old address no longer confirm or reset anything: whoever still reads that mailbox must not take the account back.
    await spendAllTokens(tx, user.id, 'verify_email');
    await spendAllTokens(tx, user.id, 'reset_password');
    await enqueueMail(tx, user.email, emailChangedMail({ displayName: user.displayName, newEmail }));
    return newEmail;
  });
}

/** What stands in the way of deleting the account, and what deleting does on the way. */
export async function deletionCheck(deps: AccountDeps, user: User): Promise<DeletionCheck> {
  const shop = await shopOfUser(deps.db, user.id);
  const blockers = await deletionBlockers(deps.db, user, shop?.id);
  const openBids = shop ? await activeBidsOfShop(deps.db, shop.id) : [];
  return {
    allowed: blockers.length === 0 && user.role !== 'admin',
    blockers,
    alsoHappens: openBids.map((b) => `Your bid on “${b.jobTitle}” is withdrawn.`),
  };
}

/**
 * Deletes the account: refused while jobs or money are in progress. What
 * identified the person goes (name, address, password, GitHub link,
 * sessions, links still out, postal addresses); their shop leaves the directory and its open
 * bids are withdrawn. Jobs, records, reviews and the ledger stay, under
 * "Deleted account", for the other party and the books.
 */
export async function deleteAccount(deps: AccountDeps, user: User, currentPassword: string): Promise<void> {
  if (user.role === 'admin') throw badRequest('A staff account is closed by another admin, not from its settings.');
  await proveCurrentPassword(user, currentPassword);
  await deps.db.transaction(async (tx) => {
    // Lock the account, so a job cannot be paid or a bid accepted for it halfway through.
    await tx.execute(sql`SELECT 1 FROM ${users} WHERE ${users.id} = ${user.id} FOR UPDATE`);
    const shop = await shopOfUser(tx, user.id);
    const blockers = await deletionBlockers(tx, user, shop?.id);
    if (blockers.length > 0) {
      throw new AppError('account_busy', `Your account cannot be deleted yet: ${blockers.map((b) => `“${b.jobTitle}”: ${b.reason}`).join(' ')}`, 409);
    }
    if (shop) {
      for (const bid of await activeBidsOfShop(tx, shop.id)) {
        await tx.update(bids).set({ status: 'withdrawn', decidedAt: new Date() }).where(eq(bids.id, bid.id));
        await tx.update(jobs).set({ bidCount: sql`greatest(${jobs.bidCount} - 1, 0)` }).where(eq(jobs.id, bid.jobId));
      }
      await tx
        .update(shops)
        .set({ name: DELETED_ACCOUNT_NAME, equipmentNotes: '', notifyMatchingJobs: false, receivingAddress: null })
        .where(eq(shops.id, shop.id));
    }
    // No job of theirs is in progress (the blockers above), so no parcel still needs the address it goes back to.
    await tx.update(jobs).set({ returnAddress: null }).where(eq(jobs.builderId, user.id));
    await updateUser(tx, user.id, {
      status: 'closed',
      closedAt: new Date(),
      displayName: DELETED_ACCOUNT_NAME,
      // Unique, and never delivered: .invalid is reserved for names that do not exist (RFC 2606).
      email: `deleted-${user.id}@deleted.invalid`,
      pendingEmail: null,
      passwordHash: null,
      githubId: null,
      emailVerifiedAt: null,
    });
    await tx.delete(userTokens).where(and(eq(userTokens.userId, user.id)));
    await deleteSessionsOfUser(tx, user.id);
    await enqueueMail(tx, user.email, accountClosedMail({ displayName: user.displayName }));
  });
  deps.hub?.signOut(user.id);
}

const iso = (value: Date | null) => (value ? value.toISOString() : null);

/** Everything Tenthmark keeps about the person and the jobs they took part in (see accountExportSchema). */
export async function accountExport(deps: AccountDeps, user: User): Promise<AccountExport> {
  const shop = await shopOfUser(deps.db, user.id);
  const jobIds = await partyJobIds(deps.db, user, shop?.id);
  const rows = await exportRows(deps.db, user, shop?.id, jobIds);
  // Dates go out as ISO text; the answer is plain JSON.
  return JSON.parse(
    JSON.stringify({
      exportedAt: new Date(),
      profile: {
        id: user.id,
        email: user.email,
        displayName: user.displayName,
        role: user.role,
        emailConfirmedAt: iso(user.emailVerifiedAt),
        githubLinked: user.githubId !== null,
        termsAcceptedAt: iso(user.termsAcceptedAt),
        termsVersion: user.termsVersion,
        createdAt: user.createdAt,
      },
      shop: shop ?? null,
      ...rows,
    }),
  ) as AccountExport;
}

/**
 * One CSV of the person's jobs and the money lines about them, for a
 * spreadsheet: text cells are guarded against formulas (server/lib/csv.ts).
 */
export async function accountCsv(deps: AccountDeps, user: User): Promise<string> {
  const shop = await shopOfUser(deps.db, user.id);
  const jobIds = await partyJobIds(deps.db, user, shop?.id);
  const rows = await exportRows(deps.db, user, shop?.id, jobIds);
  const csv = csvStringifier({ header: true, columns: ['record', 'date', 'job_id', 'job_title', 'status_or_kind', 'amount_cents', 'amount'] });
  const chunks: string[] = [];
  csv.on('data', (chunk: Buffer | string) => chunks.push(chunk.toString()));
  for (const job of rows.jobs) {
    const accepted = rows.bids.find((b) => b.id === job.awardedBidId);
    const cents = accepted?.totalCents;
    csv.write(['job', job.createdAt.toISOString(), job.id, job.title, job.status, cents ?? '', cents === undefined ? '' : csvDecimal(cents / 100, 2)]);
  }
  for (const line of rows.ledger) {
    csv.write(['money', line.createdAt.toISOString(), line.jobId, line.jobTitle, line.kind, line.amountCents, csvDecimal(line.amountCents / 100, 2)]);
  }
  await new Promise<void>((resolve) => csv.end(resolve));
  return chunks.join('');
}
