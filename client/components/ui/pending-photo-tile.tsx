import { Button } from './button';

/** A photo on its way up: chosen, uploading with its progress, uploaded, or refused with a reason. */
export interface PendingUpload<TPhoto extends { thumbUrl: string; width: number; height: number } = { thumbUrl: string; width: number; height: number }> {
  key: number;
  name: string;
  status: 'uploading' | 'done' | 'failed';
  progress: number;
  photo?: TPhoto;
  error?: string;
  controller: AbortController;
}

/** Megabytes with one decimal, for size limits and refusals. */
export const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

/**
 * One photo in a list of photos being added (to a message, to a milestone):
 * the thumbnail once uploaded, otherwise its name with the upload's progress
 * or the reason it failed; and a button to take it out.
 */
export function PendingPhotoTile({ upload, alt, onRemove, imageTestId }: { upload: PendingUpload; alt: string; onRemove: () => void; imageTestId?: string }) {
  return (
    <li className="flex w-32 flex-col gap-1 rounded-lg bg-white p-1.5 ring-1 ring-slate-200" data-status={upload.status}>
      {upload.status === 'done' && upload.photo ? (
        <img
          src={upload.photo.thumbUrl}
          alt={alt}
          width={upload.photo.width}
          height={upload.photo.height}
          className="size-[7.25rem] rounded-md bg-paper-sunk object-cover"
          data-testid={imageTestId}
        />
      ) : (
        <div className="flex size-[7.25rem] flex-col justify-end gap-1 rounded-md bg-paper-sunk p-1.5">
          <span className="truncate text-xs font-semibold text-ink" title={upload.name}>
            {upload.name}
          </span>
          {upload.status === 'uploading' ? (
            <>
              <span className="text-xs text-ink-soft">Uploading, {Math.round(upload.progress * 100)}%</span>
              <progress
                value={upload.progress}
                max={1}
                aria-label={`Upload of ${upload.name}`}
                className="block h-2 w-full appearance-none overflow-hidden rounded-full bg-slate-100 [&::-moz-progress-bar]:bg-slate-700 [&::-webkit-progress-bar]:bg-slate-100 [&::-webkit-progress-value]:bg-slate-700"
              />
            </>
          ) : (
            <span className="text-xs font-semibold text-fail" role="alert">
              {upload.error}
            </span>
          )}
        </div>
      )}
      <Button variant="quiet" className="min-h-8 px-1 py-0.5 text-sm" onClick={onRemove} aria-label={`Remove ${upload.name}`}>
        Remove
      </Button>
    </li>
  );
}
