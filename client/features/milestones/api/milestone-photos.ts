import type { MilestonePhoto, UploadedMilestonePhotos } from '@shared/schemas/milestones';
import { uploadWithProgress } from '@client/lib/upload';

/**
 * Uploads one photo for a milestone not yet logged, reporting progress; the
 * stored photo's id goes out with the milestone. Until then only the shop sees it.
 */
export function uploadMilestonePhoto(jobId: string, file: File, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<MilestonePhoto> {
  return uploadWithProgress<UploadedMilestonePhotos>({ url: `/api/jobs/${jobId}/milestone-photos`, field: 'photos', files: [file], onProgress, signal }).then(
    (answer) => answer.photos[0],
  );
}
