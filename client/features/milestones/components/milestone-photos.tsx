import type { MilestonePhoto } from '@shared/schemas/milestones';
import { PhotoThumbnails } from '@client/components/ui/photo-thumbnails';

/** A milestone's photos as thumbnails; each opens full size. */
export function MilestonePhotos({ photos, title }: { photos: MilestonePhoto[]; title: string }) {
  return <PhotoThumbnails photos={photos} className="mt-2" testId="milestone-photo" nameOf={(index, count) => `${title}: photo ${index + 1} of ${count}`} />;
}
