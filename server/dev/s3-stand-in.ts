import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';

/** The key pair s3rver accepts (it checks request signatures against it). */
export const S3_STAND_IN_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } as const;

/**
 * A local S3-compatible object store (s3rver) on loopback, keeping its objects
 * in a temporary folder removed on stop, with the named buckets made. Reach it
 * with path-style addressing at `endpoint`.
 */
export async function startS3StandIn(options: { port?: number; buckets: string[] }) {
  const directory = mkdtempSync(join(tmpdir(), 'tenthmark-s3-'));
  const server = new S3rver({
    address: '127.0.0.1',
    port: options.port ?? 0,
    silent: true,
    directory,
    configureBuckets: options.buckets.map((name) => ({ name })),
  });
  const { port } = await server.run();
  return {
    endpoint: `http://127.0.0.1:${port}`,
    directory,
    stop: async () => {
      await server.close();
      rmSync(directory, { recursive: true, force: true });
    },
  };
}
