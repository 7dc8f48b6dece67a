import type { MilestonePhoto, UploadedMilestonePhotos } from '@shared/schemas/milestones';
import { uploadWithProgress } from '@client/lib/upload';

/** The server's limits (server/lib/photo-upload.ts, server/lib/images.ts): checked here first so nobody waits for a refusal. */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;
export const ACCEPTED_PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'];

/**
 * Uploads one photo for a milestone not yet logged, reporting progress; the
 * stored photo's id goes out with the milestone. Until then only the shop sees it.
 */
export function uploadMilestonePhoto(jobId: string, file: File, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<MilestonePhoto> {
  return uploadWithProgress<UploadedMilestonePhotos>({ url: `/api/jobs/${jobId}/milestone-photos`, field: 'photos', files: [file], onProgress, signal }).then(
    (answer) => answer.photos[0],
  );
}
