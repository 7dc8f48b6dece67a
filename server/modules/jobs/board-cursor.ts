import { z } from 'zod';
import type { BoardQuery } from '../../../shared/schemas/jobs';
import { badRequest } from '../../lib/errors';

/**
 * Where a board page ended: the sort keys of its last job, ending with the job's id,
 * which makes every order total. Sent to the client as opaque base64url JSON; the
 * timestamp travels as PostgreSQL's own text so no microsecond is lost.
 */
// As PostgreSQL writes a timestamptz: 2026-12-05 09:15:07.123456+00
const PG_TIMESTAMP = /^(\d{4})-(\d{2})-(\d{2}) (\d{2}):(\d{2}):(\d{2})(\.\d{1,6})?[+-]\d{2}(:\d{2}){0,2}$/;
/** A real calendar moment (no 30 February, no hour 99), so the database is never the one to refuse it. */
function isRealMoment(text: string): boolean {
  const parts = PG_TIMESTAMP.exec(text);
  if (!parts) return false;
  const [, y, mo, d, h, mi, sec] = parts.map(Number);
  const at = new Date(Date.UTC(y, mo - 1, d, h, mi, sec));
  return at.getUTCFullYear() === y && at.getUTCMonth() === mo - 1 && at.getUTCDate() === d && at.getUTCHours() === h && at.getUTCMinutes() === mi && at.getUTCSeconds() === sec;
}
const pgTimestamp = z.string().regex(PG_TIMESTAMP).refine(isRealMoment).nullable();
const cursorSchema = z.discriminatedUnion('sort', [
  z.object({ sort: z.literal('newest'), publishedAt: pgTimestamp, id: z.uuid() }),
  z.object({ sort: z.literal('needed-soonest'), neededBy: z.iso.date(), id: z.uuid() }),
  // Metres from the board's origin (null: a job of unknown place, which come last).
  z.object({ sort: z.literal('distance'), metres: z.number().min(0).max(30_000_000).nullable(), id: z.uuid() }),
  z.object({ sort: z.literal('fewest-bids'), bidCount: z.number().int().min(0).max(2_147_483_647), publishedAt: pgTimestamp, id: z.uuid() }),
]);
export type BoardCursor = z.infer<typeof cursorSchema>;

export const encodeBoardCursor = (cursor: BoardCursor): string => Buffer.from(JSON.stringify(cursor)).toString('base64url');

const invalid = () => badRequest('That page link is not valid; start again from the first page.', { cursor: 'That page link is not valid.' });

/** The cursor of a board query, checked; a cursor made for another order is refused. */
export function decodeBoardCursor(query: Pick<BoardQuery, 'cursor' | 'sort'>): BoardCursor | undefined {
  if (query.cursor === undefined) return undefined;
  let raw: unknown;
  try {
    raw = JSON.parse(Buffer.from(query.cursor, 'base64url').toString('utf8'));
  } catch {
    throw invalid();
  }
  const parsed = cursorSchema.safeParse(raw);
  if (!parsed.success || parsed.data.sort !== query.sort) throw invalid();
  return parsed.data;
}
