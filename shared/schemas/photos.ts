import { z } from 'zod';
import { uuidSchema } from './common';

/** Which stored size of a photo to load (a path parameter). */
export const photoSizeSchema = z.enum(['thumb', 'large'], { error: 'Ask for thumb or large.' });

/** The path parameters that name one stored size of a photo (`…/:photoId/:size`), after those of what it belongs to. */
export const photoFileParamsSchema = z.object({ photoId: uuidSchema, size: photoSizeSchema });

/**
 * A stored photo as the API answers it: re-encoded as WebP in two sizes, each
 * at an address that only people who may see it can load. The same shape for
 * a conversation's, a milestone's or a job's photos.
 */
export const storedPhotoSchema = z.object({
  id: z.uuid(),
  width: z.number().int(),
  height: z.number().int(),
  thumbUrl: z.string(),
  largeUrl: z.string(),
});
export type StoredPhoto = z.infer<typeof storedPhotoSchema>;

/** The answer to a photo upload: the stored photos, in the order sent, ready to go out with what they belong to. */
export const uploadedPhotosSchema = z.object({ photos: z.array(storedPhotoSchema) });
export type UploadedPhotos = z.infer<typeof uploadedPhotosSchema>;
