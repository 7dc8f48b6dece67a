import { useId, useRef, type ReactNode } from 'react';
import { ACCEPTED_PHOTO_TYPES } from '@client/lib/upload';
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

/**
 * The photos being added, as removable tiles, and below them why a chosen
 * file was refused (or the form's own complaint about the photos).
 */
export function PendingPhotoList<TUpload extends PendingUpload>({
  uploads,
  label,
  testId,
  alt,
  imageTestId,
  onRemove,
  notice,
}: {
  uploads: TUpload[];
  label: string;
  testId: string;
  alt: (name: string) => string;
  imageTestId?: string;
  onRemove: (upload: TUpload) => void;
  notice?: string;
}) {
  return (
    <>
      {uploads.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label={label} data-testid={testId}>
          {uploads.map((upload) => (
            <PendingPhotoTile key={upload.key} upload={upload} alt={alt(upload.name)} imageTestId={imageTestId} onRemove={() => onRemove(upload)} />
          ))}
        </ul>
      )}
      {notice && (
        <p className="text-sm font-semibold text-fail" role="alert">
          {notice}
        </p>
      )}
    </>
  );
}

/**
 * "Add photos": a button that opens the file chooser (the input itself stays
 * hidden and out of the tab order), with the limits as its description.
 */
export function AddPhotosButton({
  inputTestId,
  disabled,
  onFiles,
  hint,
  hintClassName,
}: {
  inputTestId: string;
  disabled: boolean;
  onFiles: (files: File[]) => void;
  hint: ReactNode;
  hintClassName: string;
}) {
  const fileInput = useRef<HTMLInputElement>(null);
  const hintId = useId();
  return (
    <>
      <input
        ref={fileInput}
        type="file"
        multiple
        accept={ACCEPTED_PHOTO_TYPES.join(',')}
        hidden
        tabIndex={-1}
        data-testid={inputTestId}
        onChange={(event) => {
          onFiles([...(event.target.files ?? [])]);
          event.target.value = '';
        }}
      />
      <Button variant="secondary" disabled={disabled} aria-describedby={hintId} onClick={() => fileInput.current?.click()}>
        Add photos
      </Button>
      <span id={hintId} className={hintClassName}>
        {hint}
      </span>
    </>
  );
}
