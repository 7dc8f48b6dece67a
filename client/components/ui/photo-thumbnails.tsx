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
 * The full-size view of one photo among several, in a dialog: the arrow keys
 * and the buttons step through them, Escape closes, focus returns to where it was.
 */
export function PhotoViewer({
  photos,
  index,
  onIndexChange,
  title,
  alt,
  testId,
}: {
  photos: ThumbnailPhoto[];
  /** The photo shown, or null when the viewer is closed. */
  index: number | null;
  onIndexChange: (index: number | null) => void;
  title: (index: number, count: number) => string;
  alt?: (index: number, count: number) => string;
  testId?: string;
}) {
  const count = photos.length;
  const current = index === null ? undefined : photos[index];
  const step = (by: number) => index !== null && onIndexChange((index + by + count) % count);
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
  const name = title(index ?? 0, count);
  return (
    <ModalDialog open={current !== undefined} onClose={() => onIndexChange(null)} title={name} size="xl" onKeyDown={onKeyDown}>
      {current && (
        <>
          <img
            src={current.largeUrl}
            alt={(alt ?? title)(index ?? 0, count)}
            width={current.width}
            height={current.height}
            className="mx-auto max-h-[70vh] w-auto max-w-full rounded-lg bg-paper-sunk object-contain"
            data-testid={testId ? `${testId}-large` : undefined}
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
              <Button onClick={() => onIndexChange(null)} data-autofocus>
                Close
              </Button>
            </div>
          </div>
        </>
      )}
    </ModalDialog>
  );
}

/**
 * Photos as thumbnails; each opens full size in the photo viewer. Used by
 * messages and milestones.
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
  if (count === 0) return null;
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
      <PhotoViewer photos={photos} index={viewing} onIndexChange={setViewing} title={nameOf} testId={testId} />
    </>
  );
}
