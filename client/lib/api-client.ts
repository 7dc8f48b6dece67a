/**
 * The one way the browser talks to the API. Sends the CSRF token on every
 * state-changing request, and turns error answers into ApiError with the
 * server's code, message and per-field messages.
 */
import type { CsrfToken } from '@shared/schemas/auth';
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

let csrfToken: string | undefined;
let csrfRequest: Promise<string> | undefined;

/** Remembers a token the server handed back (sign-in and sign-up rotate it). */
export function setCsrfToken(token: string | undefined) {
  csrfToken = token;
}

async function fetchCsrfToken(): Promise<string> {
  csrfRequest ??= fetch('/api/auth/csrf', { credentials: 'same-origin', headers: { Accept: 'application/json' } })
    .then(async (res) => {
      if (!res.ok) throw await toApiError(res);
      const body = (await res.json()) as CsrfToken;
      csrfToken = body.csrfToken;
      return body.csrfToken;
    })
    .finally(() => {
      csrfRequest = undefined;
    });
  return csrfRequest;
}

async function toApiError(res: Response): Promise<ApiError> {
  const body = (await res.json().catch(() => undefined)) as
    | { error?: { code?: string; message?: string; fields?: Record<string, string> } }
    | undefined;
  const error = body?.error;
  if (error?.message) return new ApiError(res.status, error.code ?? 'error', error.message, error.fields ?? {});
  if (res.status === 503) return new ApiError(503, 'unavailable', 'The service is briefly unavailable. Try again in a moment.');
  return new ApiError(res.status, 'error', `The server answered ${res.status}. Try again.`);
}

/** The session's CSRF token, fetched once when needed (for requests made outside `api`, such as uploads). */
export async function getCsrfToken(): Promise<string> {
  return csrfToken ?? fetchCsrfToken();
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

async function request<T>(method: Method, path: string, body?: unknown, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken ?? (await fetchCsrfToken());

  let res: Response;
  try {
    res = await fetch(path, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'network', 'Could not reach Tenthmark. Check your connection and try again.');
  }

  if (!res.ok) {
    const error = await toApiError(res);
    // The session (and with it the token) may have changed in another tab: fetch a fresh one once.
    if (error.code === 'csrf_failed' && !retried) {
      csrfToken = undefined;
      return request<T>(method, path, body, true);
    }
    throw error;
  }
  if (res.status === 204) return undefined as T;
  const data = (await res.json()) as T & { csrfToken?: string };
  if (data && typeof data === 'object' && typeof data.csrfToken === 'string') csrfToken = data.csrfToken;
  return data;
}

export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  put: <T>(path: string, body?: unknown) => request<T>('PUT', path, body ?? {}),
  patch: <T>(path: string, body?: unknown) => request<T>('PATCH', path, body ?? {}),
  delete: <T>(path: string) => request<T>('DELETE', path),
};
