import { useQueryClient } from '@tanstack/react-query';
import { useId, useRef, useState, type DragEvent } from 'react';
import type { JobPhoto } from '@shared/schemas/jobs';
import { Button } from '@client/components/ui/button';
import { cn } from '@client/lib/cn';
import { jobKeys } from '@client/lib/query-keys';
import { ACCEPTED_PHOTO_TYPES, photoRefusal, uploadFailure, uploadWithProgress } from '@client/lib/upload';

/** The server's limit (server/modules/jobs): checked here first so nobody waits for a refusal. */
export const MAX_PHOTOS_PER_JOB = 12;

type Status = 'waiting' | 'uploading' | 'done' | 'failed' | 'refused';

interface Item {
  key: number;
  name: string;
  progress: number;
  status: Status;
  message?: string;
}

/**
 * Pick or drop photos of the parts. Each file is checked here (type, size,
 * the job's photo count), then sent on its own with a progress bar; the job
 * refreshes as each one lands. The server checks everything again and
 * re-encodes the photo without its metadata.
 */
export function PhotoUploader({ jobId, existingCount }: { jobId: string; existingCount: number }) {
  const queryClient = useQueryClient();
  const inputId = useId();
  const hintId = useId();
  const [items, setItems] = useState<Item[]>([]);
  const [dragging, setDragging] = useState(false);
  const nextKey = useRef(0);
  const queue = useRef<Promise<void>>(Promise.resolve());
  const input = useRef<HTMLInputElement>(null);

  const pending = items.filter((item) => item.status === 'waiting' || item.status === 'uploading').length;
  const room = Math.max(0, MAX_PHOTOS_PER_JOB - existingCount - pending);
  const update = (key: number, change: Partial<Item>) => setItems((all) => all.map((item) => (item.key === key ? { ...item, ...change } : item)));

  const send = async (key: number, file: File) => {
    update(key, { status: 'uploading' });
    try {
      await uploadWithProgress<{ photos: JobPhoto[] }>({
        url: `/api/jobs/${jobId}/photos`,
        field: 'photos',
        files: [file],
        onProgress: (fraction) => update(key, { progress: fraction }),
      });
      update(key, { status: 'done', progress: 1 });
      await queryClient.invalidateQueries({ queryKey: jobKeys.detail(jobId) });
    } catch (error) {
      update(key, { status: 'failed', message: uploadFailure(error) });
    }
  };

  const add = (files: File[]) => {
    if (files.length === 0) return;
    let space = room;
    const fresh: Array<{ item: Item; file?: File }> = files.map((file) => {
      const base = { key: nextKey.current++, name: file.name, progress: 0 };
      const refusal = photoRefusal(file, space, `a job can have at most ${MAX_PHOTOS_PER_JOB} photos`);
      if (refusal) return { item: { ...base, status: 'refused', message: refusal } };
      space -= 1;
      return { item: { ...base, status: 'waiting' }, file };
    });
    // A new batch replaces the finished rows of the last one.
    setItems((all) => [...all.filter((item) => item.status === 'waiting' || item.status === 'uploading'), ...fresh.map((f) => f.item)]);
    for (const { item, file } of fresh) {
      if (file) queue.current = queue.current.then(() => send(item.key, file));
    }
  };

  const onDrop = (event: DragEvent<HTMLDivElement>) => {
    event.preventDefault();
    setDragging(false);
    add([...event.dataTransfer.files]);
  };

  const full = room === 0 && pending === 0;

  return (
    <div className="flex flex-col gap-3">
      <div
        onDragOver={(event) => {
          event.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={cn(
          'flex flex-col items-center gap-3 rounded-lg border-2 border-dashed px-4 py-6 text-center',
          dragging ? 'border-slate-700 bg-slate-50' : 'border-slate-300 bg-white',
        )}
      >
        <p className="font-semibold text-ink">Drop photos of the parts here, or</p>
        <div>
          <input
            ref={input}
            id={inputId}
            type="file"
            multiple
            accept={ACCEPTED_PHOTO_TYPES.join(',')}
            disabled={full}
            aria-describedby={hintId}
            className="peer sr-only"
            onChange={(event) => {
              add([...(event.target.files ?? [])]);
              event.target.value = '';
            }}
          />
          <label
            htmlFor={inputId}
            className={cn(
              'inline-flex min-h-11 cursor-pointer items-center rounded-lg bg-slate-700 px-4 py-2 font-semibold text-white hover:bg-slate-800',
              'peer-focus-visible:outline peer-focus-visible:outline-[3px] peer-focus-visible:outline-offset-2 peer-focus-visible:outline-brass-600',
              full && 'cursor-not-allowed bg-slate-400 hover:bg-slate-400',
            )}
          >
            Choose photos
          </label>
        </div>
        <p id={hintId} className="text-sm text-ink-soft">
          JPEG, PNG or WebP, up to 15 MB each, {MAX_PHOTOS_PER_JOB} per job ({existingCount} used). Location and camera details are removed
          from every photo.
        </p>
      </div>

      {items.length > 0 && (
        <div className="flex flex-col gap-2">
          <ul className="flex flex-col gap-2" aria-label="Uploads">
            {items.map((item) => (
              <li key={item.key} className="rounded-lg bg-white px-3 py-2 ring-1 ring-slate-200">
                <div className="flex flex-wrap items-baseline justify-between gap-x-3">
                  <span className="min-w-0 truncate font-semibold text-ink">{item.name}</span>
                  <span
                    className={cn('text-sm', item.status === 'failed' || item.status === 'refused' ? 'font-semibold text-fail' : 'text-ink-soft')}
                    role={item.status === 'failed' || item.status === 'refused' ? 'alert' : undefined}
                  >
                    {item.status === 'waiting' && 'Waiting'}
                    {item.status === 'uploading' && `Uploading, ${Math.round(item.progress * 100)}%`}
                    {item.status === 'done' && 'Uploaded'}
                    {(item.status === 'failed' || item.status === 'refused') && item.message}
                  </span>
                </div>
                {item.status !== 'refused' && (
                  <progress
                    value={item.progress}
                    max={1}
                    aria-label={`Upload of ${item.name}`}
                    className="mt-2 block h-2 w-full appearance-none overflow-hidden rounded-full bg-slate-100 [&::-moz-progress-bar]:bg-slate-700 [&::-webkit-progress-bar]:bg-slate-100 [&::-webkit-progress-value]:bg-slate-700"
                  />
                )}
              </li>
            ))}
          </ul>
          {pending === 0 && (
            <Button variant="quiet" className="self-start" onClick={() => setItems([])}>
              Clear this list
            </Button>
          )}
        </div>
      )}
    </div>
  );
}
