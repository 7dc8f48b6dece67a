import { useState, type KeyboardEvent } from 'react';
import { cn } from '@client/lib/cn';
import { Button } from './button';
import { ModalDialog } from './modal-dialog';

export interface ThumbnailPhoto {
  id: string;
  width: number;
  height: number;
  thumbUrl: string;
  largeUrl: string;
}

/**
 * Photos as thumbnails; each opens full size in a dialog where the arrow keys
 * step through them and Escape closes. Used by messages and milestones.
 */
export function PhotoThumbnails({
  photos,
  nameOf,
  thumbClassName = 'size-24',
  testId,
  className,
}: {
  photos: ThumbnailPhoto[];
  /** The words for photo `index` of `count`, e.g. "Photo 1 of 2 from Lantern Hill Machine Works". */
  nameOf: (index: number, count: number) => string;
  thumbClassName?: string;
  /** Prefix for the thumbnails' and the large image's test ids. */
  testId: string;
  className?: string;
}) {
  const [viewing, setViewing] = useState<number | null>(null);
  const count = photos.length;
  const current = viewing === null ? undefined : photos[viewing];
  if (count === 0) return null;

  const step = (by: number) => setViewing((index) => (index === null ? index : (index + by + count) % count));
  const onKeyDown = (event: KeyboardEvent<HTMLDialogElement>) => {
    if (count < 2) return;
    if (event.key === 'ArrowRight') {
      event.preventDefault();
      step(1);
    } else if (event.key === 'ArrowLeft') {
      event.preventDefault();
      step(-1);
    }
  };
  const name = nameOf(viewing ?? 0, count);

  return (
    <>
      <ul className={cn('flex flex-wrap gap-2', className)} aria-label={count === 1 ? 'Photo' : `${count} photos`}>
        {photos.map((photo, index) => (
          <li key={photo.id}>
            <button
              type="button"
              onClick={() => setViewing(index)}
              className="block overflow-hidden rounded-md bg-paper-sunk ring-1 ring-slate-200 hover:ring-slate-500"
              aria-label={`Open photo ${index + 1} of ${count} full size`}
            >
              <img src={photo.thumbUrl} alt="" width={photo.width} height={photo.height} loading="lazy" className={cn(thumbClassName, 'object-cover')} data-testid={`${testId}-thumb`} />
            </button>
          </li>
        ))}
      </ul>

      <ModalDialog open={current !== undefined} onClose={() => setViewing(null)} title={name} size="xl" onKeyDown={onKeyDown}>
        {current && (
          <>
            <img
              src={current.largeUrl}
              alt={name}
              width={current.width}
              height={current.height}
              className="mx-auto max-h-[70vh] w-auto max-w-full rounded-lg bg-paper-sunk object-contain"
              data-testid={`${testId}-large`}
            />
            <div className="flex flex-wrap items-center justify-between gap-3">
              <p className="text-sm text-ink-soft">{count > 1 ? 'Left and right arrow keys step through the photos; Escape closes.' : 'Escape closes.'}</p>
              <div className="flex gap-2">
                {count > 1 && (
                  <>
                    <Button variant="secondary" onClick={() => step(-1)}>
                      <span aria-hidden>←</span> Previous
                    </Button>
                    <Button variant="secondary" onClick={() => step(1)}>
                      Next <span aria-hidden>→</span>
                    </Button>
                  </>
                )}
                <Button onClick={() => setViewing(null)} data-autofocus>
                  Close
                </Button>
              </div>
            </div>
          </>
        )}
      </ModalDialog>
    </>
  );
}
