import { MAX_PHOTOS_PER_MILESTONE } from '@shared/schemas/values';
import type { MilestonePhoto } from '@shared/schemas/milestones';
import { AddPhotosButton, PendingPhotoList, type PendingUpload } from '@client/components/ui/pending-photo-tile';
import { usePendingUploads } from '@client/hooks/use-pending-uploads';
import { milestonePhotoTarget } from '../api/milestone-photos';

export type PendingPhoto = PendingUpload<MilestonePhoto>;

/**
 * Photos for the milestone being logged: checked here (type and size), each
 * uploaded at once with its own progress bar, removable before logging.
 */
export function MilestonePhotoPicker({ jobId, photos, onChange, error }: { jobId: string; photos: PendingPhoto[]; onChange: (update: (all: PendingPhoto[]) => PendingPhoto[]) => void; error?: string }) {
  const pending = usePendingUploads(photos, onChange, milestonePhotoTarget(jobId));

  return (
    <div className="flex flex-col gap-2">
      <PendingPhotoList
        uploads={photos}
        label="Photos for this progress step"
        testId="milestone-upload-photos"
        alt={(name) => `Photo to log: ${name}`}
        onRemove={pending.remove}
        notice={pending.notice ?? error}
      />
      <div className="flex flex-wrap items-center gap-2">
        <AddPhotosButton
          inputTestId="milestone-photo-input"
          disabled={pending.full}
          onFiles={pending.add}
          hintClassName="text-sm text-ink-soft"
          hint={<>Optional. JPEG, PNG or WebP, up to 15 MB each, {MAX_PHOTOS_PER_MILESTONE} per step. Location and camera details are removed.</>}
        />
      </div>
    </div>
  );
}
