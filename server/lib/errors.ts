import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { CalculationError } from '../../shared/calc/errors';
import { isDatabaseUnavailable } from '../db/client';

export type FieldErrors = Record<string, string>;

/** The one error type the API throws on purpose. */
export class AppError extends Error {
  constructor(
    readonly code: string,
    message: string,
    readonly status: number,
    readonly fields?: FieldErrors,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const badRequest = (message: string, fields?: FieldErrors) => new AppError('invalid_input', message, 400, fields);
export const unauthorized = (message = 'Please sign in first.') => new AppError('unauthenticated', message, 401);
export const forbidden = (message = 'You are not allowed to do that.') => new AppError('forbidden', message, 403);
export const notFound = (message = 'Not found.') => new AppError('not_found', message, 404);
export const conflict = (message: string, code = 'conflict') => new AppError(code, message, 409);

export function zodFields(error: ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

export const notFoundApi: RequestHandler = (req, _res, next) => {
  next(new AppError('not_found', `No API route for ${req.method} ${req.path}.`, 404));
};

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
  message?: string;
  code?: string;
}

/**
 * PostgreSQL refusing text it cannot hold: a NUL byte in text or jsonb
 * (22021 character_not_in_repertoire, 22P05 untranslatable_character), or
 * half of a UTF-16 surrogate pair written into jsonb (22P02 on type json).
 * Such text only ever comes from a request, so it is the caller's input at fault.
 */
function isUnstorableText(error: unknown): boolean {
  for (let err = error as { code?: unknown; message?: unknown; cause?: unknown } | undefined, depth = 0; err && depth < 3; err = err.cause as typeof err, depth += 1) {
    if (err.code === '22021' || err.code === '22P05') return true;
    if (err.code === '22P02' && /type json/.test(String(err.message))) return true;
  }
  return false;
}

/** Maps every error to { error: { code, message, fields? } } without leaking internals. */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  if (res.headersSent) return;
  const send = (status: number, code: string, message: string, fields?: FieldErrors) =>
    res.status(status).json({ error: { code, message, ...(fields ? { fields } : {}) } });

  if (error instanceof AppError) return send(error.status, error.code, error.message, error.fields);
  if (error instanceof ZodError) {
    return send(400, 'invalid_input', 'Some of the values are not valid.', zodFields(error));
  }
  if (error instanceof CalculationError) {
    // The schemas catch impossible input first; this is the safety net.
    return send(400, 'invalid_input', error.message, error.field ? { [error.field]: error.message } : undefined);
  }
  // A path parameter that is not valid percent-encoding: Express's router marks it 400 but not `expose`.
  if (error instanceof URIError) return send(400, 'malformed_url', 'The address is not correctly encoded.');
  if (isUnstorableText(error)) return send(400, 'invalid_input', 'Some of the text contains characters that cannot be stored (a NUL byte, or half of a UTF-16 pair).');
  const http = error as HttpishError;
  if (http.type === 'entity.parse.failed') return send(400, 'malformed_body', 'The request body is not valid JSON.');
  if (http.type === 'entity.too.large') return send(413, 'too_large', 'The request body is too large.');
  if (http.code === 'EBADCSRFTOKEN' || http.message === 'invalid csrf token') {
    return send(403, 'csrf_failed', 'The form expired or came from elsewhere. Reload the page and try again.');
  }
  if (isDatabaseUnavailable(error)) {
    req.log?.warn({ err: error }, 'database unavailable');
    res.setHeader('Retry-After', '5');
    return send(503, 'unavailable', 'The service is briefly unavailable. Please try again in a moment.');
  }
  const status = http.status ?? http.statusCode;
  if (status && status >= 400 && status < 500 && http.expose) {
    return send(status, 'bad_request', http.message ?? 'Bad request.');
  }
  req.log?.error({ err: error }, 'unhandled error');
  return send(500, 'internal', `Something went wrong on our side. Quote reference ${String(req.id ?? '')} if it persists.`);
};
