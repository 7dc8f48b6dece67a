import { and, asc, eq, inArray, isNull } from 'drizzle-orm';
import type { MessagePhoto } from '../../../shared/schemas/messages';
import type { Executor } from '../../db/client';
import { messagePhotos } from '../../db/schema';
import { AppError } from '../../lib/errors';

export type MessagePhotoRow = typeof messagePhotos.$inferSelect;
export type PhotoSize = 'thumb' | 'large';

export const messagePhotoUrl = (threadId: string, photoId: string, size: PhotoSize) => `/api/threads/${threadId}/photos/${photoId}/${size}`;

/** Where the file of one size lives in FileStorage. */
export const messagePhotoKey = (threadId: string, photoId: string, size: PhotoSize) => `threads/${threadId}/${photoId}-${size}.webp`;

export const toMessagePhoto = (row: Pick<MessagePhotoRow, 'id' | 'threadId' | 'width' | 'height'>): MessagePhoto => ({
  id: row.id,
  width: row.width,
  height: row.height,
  thumbUrl: messagePhotoUrl(row.threadId, row.id, 'thumb'),
  largeUrl: messagePhotoUrl(row.threadId, row.id, 'large'),
});

/** The photos of each message, in the order the sender attached them. */
export async function photosOfMessages(db: Executor, messageIds: string[]): Promise<Map<string, MessagePhoto[]>> {
  const byMessage = new Map<string, MessagePhoto[]>();
  if (messageIds.length === 0) return byMessage;
  const rows = await db
    .select()
    .from(messagePhotos)
    .where(inArray(messagePhotos.messageId, messageIds))
    .orderBy(asc(messagePhotos.messageId), asc(messagePhotos.position));
  for (const row of rows) {
    const list = byMessage.get(row.messageId!) ?? [];
    list.push(toMessagePhoto(row));
    byMessage.set(row.messageId!, list);
  }
  return byMessage;
}

/**
 * Attaches photos to a new message, in the order given. Only photos this
 * person uploaded to this conversation and not yet sent qualify; anything
 * else is refused (400), and the caller's transaction, message and all, rolls
 * back. The `message_id IS NULL` condition also settles two sends racing for
 * the same photo: the second finds it taken.
 */
export async function attachPhotos(tx: Executor, input: { threadId: string; userId: string; messageId: string; photoIds: string[] }) {
  for (const [position, photoId] of input.photoIds.entries()) {
    const [attached] = await tx
      .update(messagePhotos)
      .set({ messageId: input.messageId, position })
      .where(
        and(
          eq(messagePhotos.id, photoId),
          eq(messagePhotos.threadId, input.threadId),
          eq(messagePhotos.uploadedBy, input.userId),
          isNull(messagePhotos.messageId),
        ),
      )
      .returning({ id: messagePhotos.id });
    if (!attached) {
      const which = input.photoIds.length === 1 ? 'That photo' : `Photo ${position + 1}`;
      const words = `${which} is not one you uploaded to this conversation, or it was already sent.`;
      throw new AppError('invalid_input', words, 400, { photoIds: words });
    }
  }
}
