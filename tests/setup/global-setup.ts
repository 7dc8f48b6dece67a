import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { runMigrations } from '../../server/db/client';
import { startGithubStandIn } from '../../server/dev/github-stand-in';
import { startMaildev } from '../../server/dev/maildev';
import { startS3StandIn } from '../../server/dev/s3-stand-in';
import { ensureCluster, ensureDatabase } from '../../server/dev/postgres';
import { freePort } from './ports';
import { TEST_BUCKET } from './storage';

declare module 'vitest' {
  export interface ProvidedContext {
    pgPort: number;
    templateDatabase: string;
    smtpPort: number;
    maildevUrl: string;
    githubStandInUrl: string;
    s3Endpoint: string;
  }
}

export const TEMPLATE_DATABASE = 'tenthmark_template';

/**
 * One throwaway PostgreSQL cluster in a temporary folder for the whole run,
 * with the migrations applied once into a template database; each test file
 * copies the template into a database of its own. Also maildev, the GitHub
 * stand-in and the S3 stand-in (for the suites run on object storage, see
 * tests/setup/storage.ts). Everything stops at the end, also when tests fail.
 */
export default async function setup(project: TestProject) {
  const dir = mkdtempSync(join(tmpdir(), 'tenthmark-test-'));
  const cleanups: Array<() => unknown> = [() => rmSync(dir, { recursive: true, force: true })];
  const teardown = async () => {
    for (const cleanup of cleanups.reverse()) {
      try {
        await cleanup();
      } catch (error) {
        console.error('[test setup] cleanup failed:', error);
      }
    }
    cleanups.length = 0;
  };
  // Ctrl-C during the run must not leave a PostgreSQL server behind.
  const onSignal = () => void teardown().then(() => process.exit(130));
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);

  try {
    const pgPort = await freePort();
    const cluster = ensureCluster({ dir, port: pgPort, throwaway: true });
    cleanups.push(() => cluster.stop());
    await ensureDatabase(cluster, TEMPLATE_DATABASE);
    await runMigrations(cluster.url(TEMPLATE_DATABASE));

    const smtpPort = await freePort();
    const maildev = await startMaildev({ smtpPort, webPort: await freePort() });
    cleanups.push(() => maildev.stop());

    const standIn = await startGithubStandIn({ port: 0, clientId: 'tenthmark-local', clientSecret: 'tenthmark-local-secret' });
    cleanups.push(() => standIn.close());

    const s3 = await startS3StandIn({ port: await freePort(), buckets: [TEST_BUCKET] });
    cleanups.push(() => s3.stop());

    project.provide('pgPort', pgPort);
    project.provide('templateDatabase', TEMPLATE_DATABASE);
    project.provide('smtpPort', smtpPort);
    project.provide('maildevUrl', maildev.webUrl);
    project.provide('githubStandInUrl', standIn.url);
    project.provide('s3Endpoint', s3.endpoint);
  } catch (error) {
    await teardown();
    throw error;
  }

  return async () => {
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
    await teardown();
  };
}
