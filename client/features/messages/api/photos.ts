import type { MessagePhoto, UploadedMessagePhotos } from '@shared/schemas/messages';
import { uploadWithProgress } from '@client/lib/upload';

/**
 * Uploads one photo to a conversation, reporting progress; the answer is the
 * stored photo, whose id goes out with the message. Until then only the
 * uploader can see it.
 */
export function uploadMessagePhoto(threadId: string, file: File, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<MessagePhoto> {
  return uploadWithProgress<UploadedMessagePhotos>({ url: `/api/threads/${threadId}/photos`, field: 'photos', files: [file], onProgress, signal }).then(
    (answer) => answer.photos[0],
  );
}
