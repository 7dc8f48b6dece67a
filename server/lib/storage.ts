import { mkdir, readFile, rm, writeFile, rename } from 'node:fs/promises';
import { dirname, join, resolve, sep } from 'node:path';
import { randomUUID } from 'node:crypto';

/**
 * Where uploaded files live. Today a folder on disk; an S3-compatible object
 * store can implement the same three calls later without touching callers.
 */
export interface FileStorage {
  put(key: string, data: Buffer): Promise<void>;
  /** Resolves to undefined when there is no such file. */
  get(key: string): Promise<Buffer | undefined>;
  remove(key: string): Promise<void>;
}

const KEY_PATTERN = /^[a-z0-9][a-z0-9/_-]*\.[a-z0-9]+$/;

export class LocalDiskStorage implements FileStorage {
  private readonly root: string;

  constructor(root: string) {
    this.root = resolve(root);
  }

  private pathFor(key: string): string {
    if (!KEY_PATTERN.test(key) || key.includes('..')) throw new Error(`invalid storage key: ${key}`);
    const path = resolve(join(this.root, key));
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

  async get(key: string): Promise<Buffer | undefined> {
    try {
      return await readFile(this.pathFor(key));
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
      throw error;
    }
  }

  async remove(key: string): Promise<void> {
    await rm(this.pathFor(key), { force: true });
  }
}
