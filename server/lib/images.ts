import { randomUUID } from 'node:crypto';
import { fileTypeFromBuffer, fileTypeFromFile } from 'file-type';
import sharp, { type Metadata } from 'sharp';
import { AppError } from './errors';

// libvips keeps recent operations, loads from a file included, in a cache of up to 50 MB for reuse.
// Each upload's temporary file is decoded for its own photo and then removed, so nothing there is
// ever reused: kept, it only raised the peak memory of a large upload by some 40 MB.
sharp.cache(false);

export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
/** Beyond this many pixels an image is refused before it is decoded (a decompression bomb). */
export const MAX_INPUT_PIXELS = 40_000_000;
export const LARGE_EDGE = 2000;
export const THUMB_EDGE = 480;

export interface ProcessedPhoto {
  large: Buffer;
  thumb: Buffer;
  width: number;
  height: number;
}

/**
 * An uploaded photo: the temporary file the upload was streamed into
 * (server/lib/photo-upload.ts), or bytes already in memory (scripts, tests).
 */
export type PhotoSource = { path: string } | { buffer: Buffer };

// A multer file carries both names whichever storage wrote it; a path means it is on disk.
const inputOf = (file: PhotoSource): string | Buffer => ('path' in file && typeof file.path === 'string' ? file.path : (file as { buffer: Buffer }).buffer);

/**
 * Checks what the bytes really are (never the name or the browser's word),
 * then re-encodes to a large and a thumbnail WebP. Orientation from EXIF is
 * applied first; every piece of metadata (GPS included) is dropped, because
 * sharp writes none unless asked. Given a file, only its first bytes are read
 * to sniff the type and libvips reads the rest as it decodes, so the upload
 * is never whole in the app's memory; the decoded pixels are libvips' own
 * (bounded by MAX_INPUT_PIXELS), and the two WebPs, a few hundred kilobytes,
 * are kept as buffers because their size and dimensions are recorded.
 */
export async function processPhoto(input: Buffer | string): Promise<ProcessedPhoto> {
  const sniffed = typeof input === 'string' ? await fileTypeFromFile(input) : await fileTypeFromBuffer(input);
  if (!sniffed || !(PHOTO_TYPES as readonly string[]).includes(sniffed.mime)) {
    throw new AppError('unsupported_type', 'Photos must be JPEG, PNG or WebP images.', 415);
  }
  const source = () => sharp(input, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' });
  let meta: Metadata;
  try {
    meta = await source().metadata();
  } catch (error) {
    if (/pixel limit/i.test(String(error))) throw tooManyPixels();
    throw new AppError('unreadable_image', 'This image could not be read. Is the file complete?', 415);
  }
  if (!meta.width || !meta.height || meta.width * meta.height > MAX_INPUT_PIXELS) throw tooManyPixels(meta.width, meta.height);
  try {
    const large = await source().rotate().resize({ width: LARGE_EDGE, height: LARGE_EDGE, fit: 'inside', withoutEnlargement: true }).webp({ quality: 82 }).toBuffer({ resolveWithObject: true });
    const thumb = await source().rotate().resize({ width: THUMB_EDGE, height: THUMB_EDGE, fit: 'inside', withoutEnlargement: true }).webp({ quality: 75 }).toBuffer();
    return { large: large.data, thumb, width: large.info.width, height: large.info.height };
  } catch (error) {
    if (/pixel limit/i.test(String(error))) throw tooManyPixels();
    throw new AppError('unreadable_image', 'This image could not be read. Is the file complete?', 415);
  }
}

function tooManyPixels(width?: number, height?: number) {
  const size = width && height ? ` (${width} × ${height})` : '';
  return new AppError('too_many_pixels', `This image has too many pixels${size}. Keep photos under ${MAX_INPUT_PIXELS / 1_000_000} megapixels.`, 413);
}

/**
 * The stored files of a photo whose row says `storageKey` (e.g.
 * `threads/<thread>/<photo>`): one WebP per size, as withStoredPhotos keys them.
 */
export const photoFileKeys = (storageKey: string): string[] => (['large', 'thumb'] as const).map((size) => `${storageKey}-${size}.webp`);

export interface StoredPhoto {
  id: string;
  width: number;
  height: number;
  bytes: number;
}

/**
 * Checks and re-encodes every file first, stores both sizes under
 * `keyFor(id, size)`, then lets `save` record them; if anything fails, the
 * stored files are removed again, so nothing is left half-saved.
 */
export async function withStoredPhotos<T>(
  storage: { put(key: string, data: Buffer): Promise<void>; remove(key: string): Promise<void> },
  files: PhotoSource[],
  keyFor: (id: string, size: 'large' | 'thumb') => string,
  save: (photos: StoredPhoto[]) => Promise<T>,
): Promise<T> {
  if (files.length === 0) throw new AppError('invalid_input', 'Choose at least one photo.', 400, { photos: 'Choose at least one photo.' });
  const processed: ProcessedPhoto[] = [];
  for (const file of files) processed.push(await processPhoto(inputOf(file)));
  const stored: string[] = [];
  try {
    const photos: StoredPhoto[] = [];
    for (const photo of processed) {
      const id = randomUUID();
      for (const size of ['large', 'thumb'] as const) {
        const key = keyFor(id, size);
        await storage.put(key, size === 'large' ? photo.large : photo.thumb);
        stored.push(key);
      }
      photos.push({ id, width: photo.width, height: photo.height, bytes: photo.large.length });
    }
    return await save(photos);
  } catch (error) {
    await Promise.all(stored.map((key) => storage.remove(key).catch(() => {})));
    throw error;
  }
}
