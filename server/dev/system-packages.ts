import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

/**
 * Makes sure a program from one of Debian's packages is on the machine.
 * As root it installs the package with apt-get; anyone else gets a message
 * that names the package to install.
 */
export function ensureDebianPackage(options: { pkg: string; probe: string[]; purpose: string }): void {
  if (options.probe.some((path) => existsSync(path))) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    throw new Error(
      `${options.purpose} needs Debian's "${options.pkg}" package, which is not installed.\n` +
        `Install it with:  sudo apt-get install -y --no-upgrade ${options.pkg}`,
    );
  }
  console.log(`[setup] installing Debian package "${options.pkg}" (${options.purpose}) …`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  let result = spawnSync('apt-get', ['install', '-y', '--no-upgrade', options.pkg], { stdio: 'inherit', env });
  if (result.status !== 0) {
    // The package lists may be missing or stale on a fresh machine.
    execFileSync('apt-get', ['update'], { stdio: 'inherit', env });
    result = spawnSync('apt-get', ['install', '-y', '--no-upgrade', options.pkg], { stdio: 'inherit', env });
  }
  if (result.status !== 0 || !options.probe.some((path) => existsSync(path))) {
    throw new Error(`Installing Debian's "${options.pkg}" package failed; install it by hand and try again.`);
  }
}

export const isRoot = (): boolean => typeof process.getuid === 'function' && process.getuid() === 0;
