import { useEffect, useRef, useState } from 'react';
import type { PendingUpload } from '@client/components/ui/pending-photo-tile';
import { photoRefusal, uploadFailure, type PhotoTarget } from '@client/lib/upload';

type PhotoShape = { thumbUrl: string; width: number; height: number };

/**
 * Photos being added to something not yet sent (a message, a milestone):
 * each chosen file is checked (type, size, room left), uploaded at once with
 * its own progress, and can be removed; leaving the page stops the uploads
 * still on their way. The list itself stays with the caller (`uploads`,
 * `setUploads`), so a form can send and clear it.
 */
export function usePendingUploads<TPhoto extends PhotoShape>(
  uploads: PendingUpload<TPhoto>[],
  setUploads: (update: (all: PendingUpload<TPhoto>[]) => PendingUpload<TPhoto>[]) => void,
  { max, carrier, upload }: PhotoTarget<TPhoto>,
) {
  type Pending = PendingUpload<TPhoto>;
  const [notice, setNotice] = useState<string>();
  const nextKey = useRef(0);

  const live = useRef<Pending[]>([]);
  live.current = uploads;
  useEffect(() => () => live.current.forEach((p) => p.controller.abort()), []);

  const update = (key: number, change: Partial<Pending>) => setUploads((all) => all.map((p) => (p.key === key ? { ...p, ...change } : p)));
  const counted = uploads.filter((p) => p.status !== 'failed').length;

  const add = (files: File[]) => {
    if (files.length === 0) return;
    const refused: string[] = [];
    const fresh: Array<{ pending: Pending; file: File }> = [];
    let room = max - counted;
    for (const file of files) {
      const refusal = photoRefusal(file, room, `a ${carrier} can carry at most ${max} photos`);
      if (refusal) refused.push(refusal);
      else {
        room -= 1;
        fresh.push({ pending: { key: nextKey.current++, name: file.name, status: 'uploading', progress: 0, controller: new AbortController() }, file });
      }
    }
    setNotice(refused.length ? refused.join(' ') : undefined);
    setUploads((all) => [...all, ...fresh.map((f) => f.pending)]);
    for (const { pending, file } of fresh) {
      upload(file, (fraction) => update(pending.key, { progress: fraction }), pending.controller.signal).then(
        (photo) => update(pending.key, { status: 'done', progress: 1, photo }),
        (failure: unknown) => {
          if (pending.controller.signal.aborted) return;
          update(pending.key, { status: 'failed', error: uploadFailure(failure) });
        },
      );
    }
  };

  const remove = (pending: Pending) => {
    pending.controller.abort();
    setUploads((all) => all.filter((p) => p.key !== pending.key));
  };

  return {
    add,
    remove,
    notice,
    setNotice,
    full: counted >= max,
    uploading: uploads.some((p) => p.status === 'uploading'),
    ready: uploads.filter((p) => p.status === 'done' && p.photo).map((p) => p.photo!),
  };
}
