import { and, eq } from 'drizzle-orm';
import type { MessagePhoto } from '../../../shared/schemas/messages';
import type { Database } from '../../db/client';
import { messagePhotos, type User } from '../../db/schema';
import { conflict, forbidden, notFound } from '../../lib/errors';
import { withStoredPhotos, type PhotoSource } from '../../lib/images';
import type { FileStorage, StoredFile } from '../../lib/storage';
import { messagePhotoKey, toMessagePhoto, type PhotoSize } from './message-photos.repository';
import { threadFor } from './messages.service';

export interface MessagePhotoDeps {
  db: Database;
  storage: FileStorage;
}

/** Refuses, before any bytes are read, anyone who could not send a message here. */
export async function assertMaySendPhotos(db: Database, user: User, threadId: string): Promise<void> {
  const access = await threadFor(db, threadId, user);
  if (user.id !== access.builderId && user.id !== access.shopUserId) throw forbidden('Only the two people in a conversation can send photos to it.');
  if (!access.canWrite) throw conflict('This conversation is closed to new messages.', 'thread_closed');
}

/**
 * Stores photos for a message not yet sent, through the same pipeline as job
 * photos (type sniffed from the bytes, re-encoded, metadata dropped, pixel
 * limit). Only a person who may write to the conversation can upload; the
 * photos wait, visible to their uploader alone, until a message carries them.
 */
export async function addMessagePhotos(deps: MessagePhotoDeps, user: User, threadId: string, files: PhotoSource[]): Promise<MessagePhoto[]> {
  await assertMaySendPhotos(deps.db, user, threadId);
  return withStoredPhotos(deps.storage, files, (id, size) => messagePhotoKey(threadId, id, size), async (photos) => {
    const inserted = await deps.db
      .insert(messagePhotos)
      .values(photos.map((photo) => ({ ...photo, threadId, uploadedBy: user.id, storageKey: `threads/${threadId}/${photo.id}` })))
      .returning();
    return inserted.map(toMessagePhoto);
  });
}

/**
 * A photo's file, for people who may read the conversation (threadFor: anyone
 * else gets 404). Until it is sent, only its uploader sees it.
 */
export async function readMessagePhoto(deps: MessagePhotoDeps, user: User, threadId: string, photoId: string, size: PhotoSize): Promise<StoredFile> {
  await threadFor(deps.db, threadId, user);
  const [photo] = await deps.db
    .select()
    .from(messagePhotos)
    .where(and(eq(messagePhotos.id, photoId), eq(messagePhotos.threadId, threadId)));
  if (!photo || (photo.messageId === null && photo.uploadedBy !== user.id)) throw notFound('No such photo.');
  const data = await deps.storage.get(messagePhotoKey(threadId, photo.id, size));
  if (!data) throw notFound('The photo file is missing.');
  return data;
}
