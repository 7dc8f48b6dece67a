import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/env';

/** Just enough environment for the loader in a test (nothing is opened). */
const baseEnv = { NODE_ENV: 'test', LOG_LEVEL: 'silent', UPLOADS_DIR: '/tmp/tenthmark-uploads-settings' };
const s3Env = { ...baseEnv, STORAGE: 's3', S3_BUCKET: 'tenthmark-photos', S3_ACCESS_KEY_ID: 'AKIDEXAMPLE', S3_SECRET_ACCESS_KEY: 'example-secret-key' };

describe('where uploaded photos are kept (STORAGE)', () => {
  it('when nothing is set, then photos go to the uploads folder', () => {
    expect(loadConfig(baseEnv).storage).toEqual({ kind: 'disk', dir: '/tmp/tenthmark-uploads-settings' });
  });

  it('when STORAGE=s3 names a bucket and a key pair, then the object store is used, path-style, in us-east-1 unless told', () => {
    expect(loadConfig({ ...s3Env, S3_ENDPOINT: 'http://127.0.0.1:9000' }).storage).toEqual({
      kind: 's3',
      endpoint: 'http://127.0.0.1:9000',
      bucket: 'tenthmark-photos',
      region: 'us-east-1',
      accessKeyId: 'AKIDEXAMPLE',
      secretAccessKey: 'example-secret-key',
      pathStyle: true,
    });
    expect(loadConfig({ ...s3Env, S3_REGION: 'eu-central-1', S3_PATH_STYLE: 'false' }).storage).toMatchObject({ region: 'eu-central-1', pathStyle: false, endpoint: undefined });
  });

  it('when STORAGE=s3 lacks the bucket or a credential, then startup stops and names each missing setting', () => {
    expect(() => loadConfig({ ...baseEnv, STORAGE: 's3' })).toThrow(
      /S3_BUCKET: is required when STORAGE=s3\n\s+S3_ACCESS_KEY_ID: is required when STORAGE=s3\n\s+S3_SECRET_ACCESS_KEY: is required when STORAGE=s3/,
    );
    expect(() => loadConfig({ ...s3Env, S3_SECRET_ACCESS_KEY: '' })).toThrow(/S3_SECRET_ACCESS_KEY/);
  });

  it('when STORAGE or S3_ENDPOINT is not something the app knows, then startup stops and says so', () => {
    expect(() => loadConfig({ ...baseEnv, STORAGE: 'ftp' })).toThrow(/STORAGE/);
    expect(() => loadConfig({ ...s3Env, S3_ENDPOINT: 'not a url' })).toThrow(/S3_ENDPOINT/);
  });
});
