import { useState } from 'react';
import { MilestonePhotoPicker, type PendingPhoto } from '@client/features/milestones';
import type { SectionContext } from './section-kit';

/** Photos for a section, uploaded as milestone photos; their ids are kept in the form (space-separated) at `path`. */
export function SectionPhotos({ ctx, path }: { ctx: SectionContext; path: string }) {
  const [photos, setPhotos] = useState<PendingPhoto[]>([]);
  const kept = (ctx.fields[path] ?? '').split(/\s+/).filter(Boolean);
  const uploadedHere = new Set(photos.flatMap((p) => (p.photo ? [p.photo.id] : [])));
  const earlier = kept.filter((id) => !uploadedHere.has(id));
  return (
    <div className="flex flex-col gap-1">
      {earlier.length > 0 && <p className="text-sm text-ink-soft">{earlier.length === 1 ? 'One photo is attached already.' : `${earlier.length} photos are attached already.`}</p>}
      <MilestonePhotoPicker
        jobId={ctx.job.id}
        photos={photos}
        error={ctx.errors[path]}
        onChange={(change) =>
          setPhotos((current) => {
            const next = change(current);
            const done = next.flatMap((p) => (p.status === 'done' && p.photo ? [p.photo.id] : []));
            ctx.setFields({ [path]: [...earlier, ...done].join(' ') });
            return next;
          })
        }
      />
    </div>
  );
}
