import { ApiError, getCsrfToken } from './api-client';

/** The server's photo limits (server/lib/photo-upload.ts, server/lib/images.ts): checked here first so nobody waits for a refusal. */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;
export const ACCEPTED_PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'];

/** Megabytes with one decimal, for size limits and refusals. */
export const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

/**
 * Why a chosen photo cannot be added, or undefined when it can. `room` is how
 * many more photos fit; `limit` says what holds them, e.g. "a job can have at most 12 photos".
 */
export function photoRefusal(file: File, room: number, limit: string): string | undefined {
  if (!ACCEPTED_PHOTO_TYPES.includes(file.type)) return `“${file.name}” is not a JPEG, PNG or WebP photo.`;
  if (file.size > MAX_PHOTO_BYTES) return `“${file.name}” is ${megabytes(file.size)}; each photo may be at most 15 MB.`;
  if (room <= 0) return `“${file.name}” was left out: ${limit}.`;
  return undefined;
}

/** The message of a failed upload, for the person who started it. */
export const uploadFailure = (failure: unknown) => (failure instanceof ApiError ? failure.message : 'The upload failed. Try again.');

/**
 * Uploads files as multipart form data with progress, which fetch cannot
 * report: XMLHttpRequest's upload events give bytes sent so far.
 */
export function uploadWithProgress<T>(options: {
  url: string;
  field: string;
  files: File[];
  onProgress: (fraction: number) => void;
  signal?: AbortSignal;
}): Promise<T> {
  return getCsrfToken().then(
    (token) =>
      new Promise<T>((resolve, reject) => {
        const form = new FormData();
        for (const file of options.files) form.append(options.field, file, file.name);
        const xhr = new XMLHttpRequest();
        xhr.open('POST', options.url);
        xhr.setRequestHeader('X-CSRF-Token', token);
        xhr.setRequestHeader('Accept', 'application/json');
        xhr.responseType = 'json';
        xhr.upload.onprogress = (event) => {
          if (event.lengthComputable) options.onProgress(event.loaded / event.total);
        };
        xhr.onload = () => {
          const body = xhr.response as { error?: { code: string; message: string; fields?: Record<string, string> } } | null;
          if (xhr.status >= 200 && xhr.status < 300) {
            options.onProgress(1);
            resolve(body as T);
          } else {
            reject(new ApiError(xhr.status, body?.error?.code ?? 'error', body?.error?.message ?? `The upload failed (${xhr.status}).`, body?.error?.fields ?? {}));
          }
        };
        xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload could not reach Tenthmark. Check your connection and try again.'));
        xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped.'));
        options.signal?.addEventListener('abort', () => xhr.abort());
        xhr.send(form);
      }),
  );
}

/** Where the photos of something not yet sent (a message, a milestone) are uploaded, and how many it carries. */
export interface PhotoTarget<TPhoto> {
  max: number;
  /** What carries them, for the refusal: "a message can carry at most 6 photos". */
  carrier: string;
  /** Uploads one photo, reporting progress; the answer is the stored photo, whose id goes out with the message or milestone. */
  upload: (file: File, onProgress: (fraction: number) => void, signal: AbortSignal) => Promise<TPhoto>;
}

export function photoTarget<TPhoto>(url: string, max: number, carrier: string): PhotoTarget<TPhoto> {
  return {
    max,
    carrier,
    upload: (file, onProgress, signal) =>
      uploadWithProgress<{ photos: TPhoto[] }>({ url, field: 'photos', files: [file], onProgress, signal }).then((answer) => answer.photos[0]),
  };
}
