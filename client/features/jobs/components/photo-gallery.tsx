import { useState } from 'react';
import { toast } from '@client/lib/toast';
import type { JobPhoto } from '@shared/schemas/jobs';
import { Button } from '@client/components/ui/button';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { PhotoViewer } from '@client/components/ui/photo-thumbnails';
import { useRemovePhoto } from '../api/jobs';

export interface PhotoGalleryProps {
  jobId: string;
  jobTitle: string;
  photos: JobPhoto[];
  /** The owner may remove photos while the job is a draft or open. */
  canRemove: boolean;
}

/**
 * Thumbnails of a job's photos; each opens a full-size view in a dialog where
 * the arrow keys step through the photos and Escape closes.
 */
export function PhotoGallery({ jobId, jobTitle, photos, canRemove }: PhotoGalleryProps) {
  const [viewing, setViewing] = useState<number | null>(null);
  const [removing, setRemoving] = useState<JobPhoto | null>(null);
  const remove = useRemovePhoto(jobId, {
    mutationConfig: {
      onSuccess: () => {
        toast.success('Photo removed.');
        setRemoving(null);
      },
    },
  });
  const count = photos.length;
  if (count === 0) return <p className="text-ink-soft">No photos yet.</p>;

  return (
    <>
      <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" aria-label="Photos">
        {photos.map((photo, index) => (
          <li key={photo.id} className="flex flex-col gap-1">
            <button
              type="button"
              onClick={() => setViewing(index)}
              className="group block overflow-hidden rounded-lg bg-paper-sunk ring-1 ring-slate-200 hover:ring-slate-500"
              aria-label={`Open photo ${index + 1} of ${count} full size`}
            >
              <img
                src={photo.thumbUrl}
                alt=""
                width={photo.width}
                height={photo.height}
                className="aspect-[4/3] w-full object-cover transition-transform group-hover:scale-[1.02]"
                data-testid="job-photo-thumb"
              />
            </button>
            {canRemove && (
              <Button variant="quiet" className="min-h-9 self-start px-2 py-1 text-sm" onClick={() => setRemoving(photo)} aria-label={`Remove photo ${index + 1}`}>
                Remove
              </Button>
            )}
          </li>
        ))}
      </ul>

      <PhotoViewer
        photos={photos}
        index={viewing}
        onIndexChange={setViewing}
        title={(index, total) => `Photo ${index + 1} of ${total}`}
        alt={(index, total) => `Photo ${index + 1} of ${total} for “${jobTitle}”`}
      />

      <ConfirmDialog
        open={removing !== null}
        onClose={() => {
          setRemoving(null);
          remove.reset();
        }}
        onConfirm={() => removing && remove.mutate(removing.id)}
        title="Remove this photo?"
        description="Shops will no longer see it. You can upload it again later."
        confirmLabel="Remove photo"
        cancelLabel="Keep it"
        tone="danger"
        mutation={remove}
      />
    </>
  );
}
