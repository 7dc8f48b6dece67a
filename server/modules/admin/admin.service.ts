import { and, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import type { CreateAdminInput, UserSearchInput } from '../../../shared/schemas/admin';
import type { Database } from '../../db/client';
import { users, type User } from '../../db/schema';
import { AppError } from '../../lib/errors';
import { enqueueMail } from '../../lib/mail/outbox';
import { adminInviteMail } from '../../lib/mail/templates';
import { issueToken } from '../auth/tokens';
import { insertUser } from '../users/users.repository';
import { recordAdminAction } from './audit';

const INVITE_TTL_MS = 72 * 60 * 60_000;

/**
 * Admins exist only from the seed or by another admin. The new admin gets no
 * password; a single-use link lets them choose one.
 */
export async function createAdmin(deps: { db: Database; appUrl: string }, input: CreateAdminInput, invitedBy: User) {
  return deps.db.transaction(async (tx) => {
    const user = await insertUser(tx, { email: input.email, displayName: input.displayName, role: 'admin' });
    if (!user) {
      throw new AppError('email_taken', 'An account with this e-mail address already exists.', 409, {
        email: 'An account with this e-mail address already exists.',
      });
    }
    await recordAdminAction(tx, { adminId: invitedBy.id, action: 'admin.create', targetType: 'user', targetId: user.id, details: { email: user.email } });
    const token = await issueToken(tx, user.id, 'reset_password', INVITE_TTL_MS);
    await enqueueMail(
      tx,
      user.email,
      adminInviteMail({ displayName: user.displayName, invitedBy: invitedBy.displayName, url: `${deps.appUrl}/reset-password?token=${token}`, hours: 72 }),
    );
    return user;
  });
}

export async function searchUsers(db: Database, input: UserSearchInput) {
  const filters: SQL[] = [];
  if (input.q) {
    const pattern = `%${input.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    filters.push(or(ilike(users.email, pattern), ilike(users.displayName, pattern))!);
  }
  if (input.role) filters.push(eq(users.role, input.role));
  const where = filters.length ? and(...filters) : undefined;
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({
        id: users.id,
        email: users.email,
        displayName: users.displayName,
        role: users.role,
        status: users.status,
        emailVerifiedAt: users.emailVerifiedAt,
        createdAt: users.createdAt,
      })
      .from(users)
      .where(where)
      .orderBy(desc(users.createdAt), users.id)
      .limit(input.limit)
      .offset(input.offset),
    db.select({ total: sql<number>`count(*)::int` }).from(users).where(where),
  ]);
  return { users: rows, total };
}
