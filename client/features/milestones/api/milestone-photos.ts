import { MAX_PHOTOS_PER_MILESTONE } from '@shared/schemas/values';
import type { MilestonePhoto } from '@shared/schemas/milestones';
import { photoTarget } from '@client/lib/upload';

/**
 * Photos for a milestone not yet logged are uploaded one by one; their ids go
 * out with the milestone. Until then only the shop sees them.
 */
export const milestonePhotoTarget = (jobId: string) => photoTarget<MilestonePhoto>(`/api/jobs/${jobId}/milestone-photos`, MAX_PHOTOS_PER_MILESTONE, 'milestone');
