import type { Request, RequestHandler, Response } from 'express';
import { rm } from 'node:fs/promises';
import { pipeline } from 'node:stream/promises';
import multer from 'multer';
import type { Database } from '../db/client';
import { AppError } from './errors';
import { createLimiter } from './rate-limit';
import type { StoredFile } from './storage';

/** The most one photo may weigh on the way in, before it is re-encoded. */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;

/** The window of the per-person upload limit (RATE_LIMIT_UPLOADS_PER_10_MIN). */
export const UPLOAD_WINDOW_MS = 10 * 60_000;

/**
 * Photo uploads per person (job, conversation and milestone photos counted
 * together), shared by every instance through PostgreSQL: 429 with
 * Retry-After past the limit. Goes after the route's access check and before
 * `receivePhotos`, so a refused upload is never read, let alone decoded.
 */
export function uploadLimiter(db: Database, perTenMinutes: number): RequestHandler {
  return createLimiter({
    db,
    name: 'uploads',
    windowMs: UPLOAD_WINDOW_MS,
    limit: perTenMinutes,
    message: 'You are uploading photos too fast. Wait a few minutes and try again.',
    // Behind the route's access guard, so there is always a person to count.
    keyGenerator: (req) => req.user!.id,
  });
}

/**
 * Multipart photo uploads in the field "photos", at most `maxFiles` per
 * request, each streamed into a temporary file (the system's temp folder) for
 * `processPhoto` (server/lib/images.ts) to read, so four 15 MB photos are never
 * held in memory; the files are removed once the answer has gone (or the
 * connection dropped), and multer removes them itself when it refuses an upload. Every route puts the
 * access check for its job or conversation and `uploadLimiter` before it, so
 * nothing is read or decoded for someone who may not upload. multer's own errors
 * come out in the API's error shape: too big or too many is 413, the rest
 * (and a body busboy cannot read) 400.
 */
export function receivePhotos(maxFiles: number): RequestHandler {
  const upload = multer({
    storage: multer.diskStorage({}),
    limits: { fileSize: MAX_PHOTO_BYTES, files: maxFiles, fields: 5, parts: maxFiles + 5 },
  }).array('photos', maxFiles);

  return (req, res, next) => {
    res.once('close', () => {
      // A part cut off mid-way is listed without a path (multer removes what it wrote of it).
      for (const file of uploadedFiles(req)) if (file.path) rm(file.path, { force: true }).catch(() => {});
    });
    upload(req, res, (error: unknown) => {
      if (!error) return next();
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') return next(new AppError('too_large', `Each photo may be at most ${MAX_PHOTO_BYTES / 1024 / 1024} MB.`, 413));
        if (error.code === 'LIMIT_FILE_COUNT' || error.code === 'LIMIT_PART_COUNT') {
          return next(new AppError('too_many_photos', `Send at most ${maxFiles} photos at a time.`, 413));
        }
        return next(new AppError('invalid_input', `The upload is not valid (${error.message}). Send the files in a field named "photos".`, 400));
      }
      // Anything else comes from reading the multipart body itself (busboy: no boundary, a cut-off or malformed part).
      next(new AppError('invalid_input', 'The upload could not be read. Send the photos as multipart/form-data in a field named "photos".', 400));
    });
  };
}

/** The files multer kept, or none. */
export const uploadedFiles = (req: { files?: unknown }): Express.Multer.File[] => (Array.isArray(req.files) ? (req.files as Express.Multer.File[]) : []);

/**
 * What runs before a photo upload's handler, in order: the route's own check
 * that this person may upload here (so a refusal neither counts against them
 * nor reads a byte), the per-person upload limit, then the files themselves.
 */
export function photoUploadSteps(mayUpload: (req: Request) => Promise<void>, uploadLimit: RequestHandler, maxFiles: number): RequestHandler[] {
  return [
    async (req, _res, next) => {
      await mayUpload(req);
      next();
    },
    uploadLimit,
    receivePhotos(maxFiles),
  ];
}

/**
 * Streams a stored photo's WebP bytes (from disk or the object store, never
 * whole in memory), cached only by the person's own browser (every photo is
 * someone's to see). A read that breaks off midway cuts the connection, so the
 * browser never keeps half a photo as if it were whole.
 */
export async function sendPhoto(res: Response, webp: StoredFile): Promise<void> {
  res.set({ 'Content-Type': 'image/webp', 'Cache-Control': 'private, max-age=3600', 'X-Content-Type-Options': 'nosniff' });
  if (webp.size !== undefined) res.set('Content-Length', String(webp.size));
  try {
    await pipeline(webp.body, res);
  } catch (error) {
    // The person went away (nothing to answer), or the store failed after the headers went out.
    if (res.destroyed && (error as NodeJS.ErrnoException).code === 'ERR_STREAM_PREMATURE_CLOSE') return;
    throw error;
  }
}
