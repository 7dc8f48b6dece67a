import type { MessagePhoto } from '@shared/schemas/messages';
import { MAX_PHOTOS_PER_MESSAGE } from '@shared/schemas/values';
import { photoTarget } from '@client/lib/upload';

/**
 * Photos for a message are uploaded to its conversation one by one, before
 * the message is sent; until then only the uploader can see them.
 */
export const messagePhotoTarget = (threadId: string) => photoTarget<MessagePhoto>(`/api/threads/${threadId}/photos`, MAX_PHOTOS_PER_MESSAGE, 'message');
