import { createReadStream } from 'node:fs';
import { mkdir, rm, stat, writeFile, rename } from 'node:fs/promises';
import { dirname, join, resolve, sep } from 'node:path';
import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import type { S3Client } from '@aws-sdk/client-s3';
import type { StorageConfig } from '../env';

/** A stored file as it is read back: its bytes as a stream (send it, or destroy it) and its length when the store says it. */
export interface StoredFile {
  body: Readable;
  size?: number;
}

/**
 * Where uploaded files live: a folder on the app's own disk (the default), or
 * an S3-compatible object store shared by every app instance (STORAGE=s3).
 */
export interface FileStorage {
  put(key: string, data: Buffer): Promise<void>;
  /** Resolves to undefined when there is no such file. */
  get(key: string): Promise<StoredFile | undefined>;
  /** Removing a file that is not there is not an error. */
  remove(key: string): Promise<void>;
  /** Lets go of what the storage holds open (the object store's connections); called once, at shutdown. */
  close(): Promise<void>;
}

const KEY_PATTERN = /^[a-z0-9][a-z0-9/_-]*\.[a-z0-9]+$/;

/** Keys are made by the app (e.g. jobs/<job>/<photo>-large.webp); anything else is a bug, refused on both storages. */
function checkKey(key: string): string {
  if (!KEY_PATTERN.test(key) || key.includes('..') || key.includes('//')) throw new Error(`invalid storage key: ${key}`);
  return key;
}

export class LocalDiskStorage implements FileStorage {
  private readonly root: string;

  constructor(root: string) {
    this.root = resolve(root);
  }

  private pathFor(key: string): string {
    const path = resolve(join(this.root, checkKey(key)));
    if (!path.startsWith(this.root + sep)) throw new Error(`storage key escapes the root: ${key}`);
    return path;
  }

  async put(key: string, data: Buffer): Promise<void> {
    const path = this.pathFor(key);
    await mkdir(dirname(path), { recursive: true });
    // Write then rename, so a reader never sees half a file.
    const temporary = `${path}.${randomUUID()}.part`;
    await writeFile(temporary, data);
    await rename(temporary, path);
  }

  async get(key: string): Promise<StoredFile | undefined> {
    const path = this.pathFor(key);
    try {
      // A file replaced between stat and open is read whole either way (put renames over it).
      const { size } = await stat(path);
      return { body: createReadStream(path), size };
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
      throw error;
    }
  }

  async remove(key: string): Promise<void> {
    await rm(this.pathFor(key), { force: true });
  }

  /** Nothing is held open between calls. */
  async close(): Promise<void> {}
}

const CONTENT_TYPES: Record<string, string> = { webp: 'image/webp', pdf: 'application/pdf' };

type S3Config = Extract<StorageConfig, { kind: 's3' }>;

// The SDK takes a sixth of a second to load: only an app set up with STORAGE=s3 pays for it.
let sdk: Promise<typeof import('@aws-sdk/client-s3')> | undefined;
const loadSdk = () => (sdk ??= import('@aws-sdk/client-s3'));

/** A client for the object store the settings name. */
export async function s3ClientFor(config: S3Config): Promise<S3Client> {
  const { S3Client } = await loadSdk();
  return new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    forcePathStyle: config.pathStyle,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    // Since early 2025 the SDK adds a CRC32 checksum to every upload by default, and sends a
    // streamed body as aws-chunked with the checksum in a trailer. Stores that predate that
    // refuse the new headers, or (the test stand-in, s3rver 3.7) keep the chunk framing as part
    // of the object: the photo comes back with "5\r\n…\r\n0\r\nx-amz-checksum-crc32:…" around it.
    // Checksums only where the API requires them keeps every S3-compatible store working.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
}

/** Any S3-compatible object store, one bucket, keys as given (path-style addressing when the settings ask for it). */
export class S3Storage implements FileStorage {
  private readonly client: Promise<S3Client>;
  private readonly bucket: string;

  constructor(config: S3Config) {
    this.client = s3ClientFor(config);
    this.bucket = config.bucket;
  }

  async put(key: string, data: Buffer): Promise<void> {
    const extension = key.slice(key.lastIndexOf('.') + 1);
    const { PutObjectCommand } = await loadSdk();
    await (await this.client).send(
      new PutObjectCommand({
        Bucket: this.bucket,
        Key: checkKey(key),
        Body: data,
        ContentLength: data.length,
        ContentType: CONTENT_TYPES[extension] ?? 'application/octet-stream',
      }),
    );
  }

  async get(key: string): Promise<StoredFile | undefined> {
    const { GetObjectCommand, S3ServiceException } = await loadSdk();
    try {
      const answer = await (await this.client).send(new GetObjectCommand({ Bucket: this.bucket, Key: checkKey(key) }));
      if (!answer.Body) throw new Error(`the object store sent no body for ${key}`);
      return { body: answer.Body as Readable, size: answer.ContentLength };
    } catch (error) {
      if (error instanceof S3ServiceException && (error.name === 'NoSuchKey' || error.$metadata.httpStatusCode === 404)) return undefined;
      throw error;
    }
  }

  async remove(key: string): Promise<void> {
    // S3 answers 204 for a key that is not there, so removing twice is fine.
    const { DeleteObjectCommand } = await loadSdk();
    await (await this.client).send(new DeleteObjectCommand({ Bucket: this.bucket, Key: checkKey(key) }));
  }

  /** Closes the client's kept-alive connections, so they hold neither the process nor the store's sockets after shutdown. */
  async close(): Promise<void> {
    (await this.client).destroy();
  }
}

/** The storage the settings choose: the uploads folder, or the object store. */
export function createStorage(config: StorageConfig): FileStorage {
  return config.kind === 's3' ? new S3Storage(config) : new LocalDiskStorage(config.dir);
}
