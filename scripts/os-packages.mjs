// The operating-system programs `npm test` needs beyond Node: Debian's Chromium (browser tests),
// numpy/scipy (the reference computations the signal tests compare against) and redis-server
// (the BullMQ queue tests). Installed with apt-get when we run as root; otherwise we stop and
// print the one command that installs them.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Each need: a Debian package list and a check that says whether it is already here. */
const NEEDS = [
  { what: 'Chromium (browser tests)', packages: ['chromium'], present: () => existsSync(CHROMIUM) },
  {
    what: 'numpy and scipy (reference computations)',
    packages: ['python3-numpy', 'python3-scipy'],
    present: () =>
      spawnSync('python3', ['-c', 'import numpy, scipy'], { stdio: 'ignore' }).status === 0,
  },
  {
    what: 'redis-server (queue tests)',
    packages: ['redis-server'],
    present: () =>
      spawnSync('redis-server', ['--version'], { stdio: 'ignore' }).status === 0 ||
      existsSync('/usr/bin/redis-server'),
  },
];

function apt(args) {
  const outcome = spawnSync('apt-get', args, {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  return outcome.status === 0;
}

/**
 * Returns true when every program is present (installing what is missing if we may), false
 * after printing what to run by hand.
 */
export function ensureOsPackages() {
  const missing = NEEDS.filter((need) => !need.present());
  if (missing.length === 0) return true;
  const packages = missing.flatMap((need) => need.packages);
  const command = `sudo apt-get install -y ${packages.join(' ')}`;
  console.log(`Missing: ${missing.map((need) => need.what).join('; ')}.`);
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  const hasApt = spawnSync('apt-get', ['--version'], { stdio: 'ignore' }).status === 0;
  if (!isRoot || !hasApt) {
    console.error(
      hasApt
        ? `Install them, then run npm test again:\n  ${command}`
        : `This machine has no apt-get. Install the equivalent of: ${packages.join(', ')}`,
    );
    return false;
  }
  console.log(`Installing with apt-get: ${packages.join(' ')}`);
  if (!apt(['update', '-qq']) || !apt(['install', '-y', '-qq', ...packages])) {
    console.error(`apt-get could not install them. Try by hand:\n  ${command}`);
    return false;
  }
  const still = NEEDS.filter((need) => !need.present());
  if (still.length > 0) {
    console.error(`Still missing after apt-get: ${still.map((need) => need.what).join('; ')}`);
    return false;
  }
  return true;
}
