/**
 * Runs before the test suite: makes sure the machine has what the tests need
 * from Debian's packages (PostgreSQL, and Chromium for the browser tests),
 * installing them as root, or stopping with a message that names the package.
 */
import { ensurePostgresInstalled } from '../../server/dev/postgres';
import { ensureDebianPackage } from '../../server/dev/system-packages';

try {
  ensurePostgresInstalled();
  ensureDebianPackage({
    pkg: 'chromium',
    probe: ['/usr/bin/chromium'],
    purpose: 'The browser tests drive a real Chromium',
  });
} catch (error) {
  console.error(`\n${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
}
