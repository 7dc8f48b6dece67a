import { readdir } from 'node:fs/promises';
import { join, relative } from 'node:path';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { S3_STAND_IN_CREDENTIALS } from '../../server/dev/s3-stand-in';
import type { StorageConfig } from '../../server/env';
import { s3ClientFor } from '../../server/lib/storage';

/** The bucket on the S3 stand-in that every test file's app shares (photo keys carry their job's or conversation's id). */
export const TEST_BUCKET = 'tenthmark-test';

/**
 * Which storage the app under test keeps photos in: the uploads folder, or,
 * with TENTHMARK_TEST_STORAGE=s3 (the vitest project "integration-s3" sets it
 * for the photo suites), the S3 stand-in the global setup starts.
 */
export const STORAGE_UNDER_TEST: 'disk' | 's3' = process.env.TENTHMARK_TEST_STORAGE === 's3' ? 's3' : 'disk';

/** The settings that point an app at the S3 stand-in, or none for the uploads folder. */
export function storageSettings(s3Endpoint: string, kind = STORAGE_UNDER_TEST): Record<string, string> {
  if (kind === 'disk') return {};
  return {
    STORAGE: 's3',
    S3_ENDPOINT: s3Endpoint,
    S3_BUCKET: TEST_BUCKET,
    S3_ACCESS_KEY_ID: S3_STAND_IN_CREDENTIALS.accessKeyId,
    S3_SECRET_ACCESS_KEY: S3_STAND_IN_CREDENTIALS.secretAccessKey,
  };
}

/** Every key stored under `prefix` (e.g. `jobs/<id>/`), sorted: what a test checks to see that nothing was left behind. */
export async function storedKeys(storage: StorageConfig, prefix: string): Promise<string[]> {
  if (storage.kind === 'disk') {
    const entries = await readdir(join(storage.dir, prefix), { recursive: true, withFileTypes: true }).catch((error: NodeJS.ErrnoException) => {
      if (error.code === 'ENOENT') return [];
      throw error;
    });
    return entries
      .filter((entry) => entry.isFile())
      .map((entry) => relative(storage.dir, join(entry.parentPath, entry.name)))
      .sort();
  }
  const client = await s3ClientFor(storage);
  try {
    const answer = await client.send(new ListObjectsV2Command({ Bucket: storage.bucket, Prefix: prefix }));
    return (answer.Contents ?? []).map((object) => object.Key!).sort();
  } finally {
    client.destroy();
  }
}
