import { useEffect, useId, useRef, useState } from 'react';
import { MAX_PHOTOS_PER_MILESTONE } from '@shared/schemas/inspection';
import type { MilestonePhoto } from '@shared/schemas/milestones';
import { Button } from '@client/components/ui/button';
import { PendingPhotoTile, type PendingUpload, megabytes } from '@client/components/ui/pending-photo-tile';
import { ApiError } from '@client/lib/api-client';
import { ACCEPTED_PHOTO_TYPES, MAX_PHOTO_BYTES, uploadMilestonePhoto } from '../api/milestone-photos';

export type PendingPhoto = PendingUpload<MilestonePhoto>;

/**
 * Photos for the milestone being logged: checked here (type and size), each
 * uploaded at once with its own progress bar, removable before logging.
 */
export function MilestonePhotoPicker({ jobId, photos, onChange, error }: { jobId: string; photos: PendingPhoto[]; onChange: (update: (all: PendingPhoto[]) => PendingPhoto[]) => void; error?: string }) {
  const [notice, setNotice] = useState<string>();
  const fileInput = useRef<HTMLInputElement>(null);
  const hintId = useId();
  const nextKey = useRef(0);

  // Leaving the form stops uploads still on their way.
  const live = useRef<PendingPhoto[]>([]);
  live.current = photos;
  useEffect(() => () => live.current.forEach((p) => p.controller.abort()), []);

  const update = (key: number, change: Partial<PendingPhoto>) => onChange((all) => all.map((p) => (p.key === key ? { ...p, ...change } : p)));
  const counted = photos.filter((p) => p.status !== 'failed').length;
  const full = counted >= MAX_PHOTOS_PER_MILESTONE;

  const addPhotos = (files: File[]) => {
    if (files.length === 0) return;
    const refused: string[] = [];
    const fresh: Array<{ pending: PendingPhoto; file: File }> = [];
    let room = MAX_PHOTOS_PER_MILESTONE - counted;
    for (const file of files) {
      if (!ACCEPTED_PHOTO_TYPES.includes(file.type)) refused.push(`“${file.name}” is not a JPEG, PNG or WebP photo.`);
      else if (file.size > MAX_PHOTO_BYTES) refused.push(`“${file.name}” is ${megabytes(file.size)}; each photo may be at most 15 MB.`);
      else if (room <= 0) refused.push(`“${file.name}” was left out: a milestone can carry at most ${MAX_PHOTOS_PER_MILESTONE} photos.`);
      else {
        room -= 1;
        fresh.push({ pending: { key: nextKey.current++, name: file.name, status: 'uploading', progress: 0, controller: new AbortController() }, file });
      }
    }
    setNotice(refused.length ? refused.join(' ') : undefined);
    onChange((all) => [...all, ...fresh.map((f) => f.pending)]);
    for (const { pending, file } of fresh) {
      uploadMilestonePhoto(jobId, file, (fraction) => update(pending.key, { progress: fraction }), pending.controller.signal).then(
        (photo) => update(pending.key, { status: 'done', progress: 1, photo }),
        (failure: unknown) => {
          if (pending.controller.signal.aborted) return;
          update(pending.key, { status: 'failed', error: failure instanceof ApiError ? failure.message : 'The upload failed. Try again.' });
        },
      );
    }
  };

  const remove = (pending: PendingPhoto) => {
    pending.controller.abort();
    onChange((all) => all.filter((p) => p.key !== pending.key));
  };

  const message = notice ?? error;
  return (
    <div className="flex flex-col gap-2">
      {photos.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Photos for this milestone" data-testid="milestone-upload-photos">
          {photos.map((pending) => (
            <PendingPhotoTile key={pending.key} upload={pending} alt={`Photo to log: ${pending.name}`} onRemove={() => remove(pending)} />
          ))}
        </ul>
      )}
      {message && (
        <p className="text-sm font-semibold text-fail" role="alert">
          {message}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-2">
        <input
          ref={fileInput}
          type="file"
          multiple
          accept={ACCEPTED_PHOTO_TYPES.join(',')}
          hidden
          tabIndex={-1}
          data-testid="milestone-photo-input"
          onChange={(event) => {
            addPhotos([...(event.target.files ?? [])]);
            event.target.value = '';
          }}
        />
        <Button variant="secondary" disabled={full} aria-describedby={hintId} onClick={() => fileInput.current?.click()}>
          Add photos
        </Button>
        <span id={hintId} className="text-sm text-ink-soft">
          Optional. JPEG, PNG or WebP, up to 15 MB each, {MAX_PHOTOS_PER_MILESTONE} per milestone. Location and camera details are removed.
        </span>
      </div>
    </div>
  );
}
