import { ApiError, getCsrfToken } from './api-client';

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
