// `npm test`: every check of every workspace, then one closing line `N passed, N failed`.
// Its lint steps (eslint, prettier, knip) are exactly `npm run lint`'s (package.json).
// Lint, format and type checks count as one check each; test runners count their tests.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { buildIfStale } from './build-if-stale.mjs';
import { ensureOsPackages } from './os-packages.mjs';

const root = resolve(import.meta.dirname, '..');
const reports = mkdtempSync(join(tmpdir(), 'gyre-test-reports-'));
const results = [];

function run(command, args, cwd = root) {
  console.log(
    `\n$ ${[command, ...args].join(' ')}${cwd === root ? '' : `   (in ${cwd.slice(root.length + 1)})`}`,
  );
  const outcome = spawnSync(command, args, {
    cwd,
    stdio: 'inherit',
    env: { ...process.env, FORCE_COLOR: '0' },
  });
  return outcome.status === 0;
}

/** Seconds since `startedMs`, for the closing table (where CI time goes). */
function secondsSince(startedMs) {
  return (performance.now() - startedMs) / 1000;
}

function check(name, command, args, cwd) {
  const started = performance.now();
  const ok = run(command, args, cwd);
  results.push({ name, passed: ok ? 1 : 0, failed: ok ? 0 : 1, seconds: secondsSince(started) });
}

/** Runs a jest or vitest suite with its JSON report and counts its tests. */
function suite(name, command, args, cwd) {
  const reportFile = join(reports, `${name.replace(/\W+/g, '-')}.json`);
  const started = performance.now();
  const ok = run(command, [...args, '--json', `--outputFile=${reportFile}`], cwd);
  let passed = 0;
  let failed = 0;
  if (existsSync(reportFile)) {
    const report = JSON.parse(readFileSync(reportFile, 'utf8'));
    passed = report.numPassedTests ?? 0;
    failed = (report.numFailedTests ?? 0) + (report.numRuntimeErrorTestSuites ?? 0);
  }
  // A runner that failed without a failed test (a suite that did not load, no tests found) still fails.
  if (!ok && failed === 0) failed = 1;
  results.push({ name, passed, failed, seconds: secondsSince(started) });
}

function vitestSuite(name, args, cwd) {
  const reportFile = join(reports, `${name.replace(/\W+/g, '-')}.json`);
  const started = performance.now();
  const ok = run(
    'npx',
    [
      'vitest',
      'run',
      ...args,
      '--reporter=default',
      '--reporter=json',
      `--outputFile.json=${reportFile}`,
    ],
    cwd,
  );
  let passed = 0;
  let failed = 0;
  if (existsSync(reportFile)) {
    const report = JSON.parse(readFileSync(reportFile, 'utf8'));
    passed = report.numPassedTests ?? 0;
    failed = report.numFailedTests ?? 0;
  }
  if (!ok && failed === 0) failed = 1;
  results.push({ name, passed, failed, seconds: secondsSince(started) });
}

// Chromium, numpy/scipy and redis-server: installed here when we may, or the exact command.
if (!ensureOsPackages()) process.exit(1);

const buildStarted = performance.now();
try {
  buildIfStale();
  results.push({ name: 'build', passed: 1, failed: 0, seconds: secondsSince(buildStarted) });
} catch {
  results.push({ name: 'build', passed: 0, failed: 1, seconds: secondsSince(buildStarted) });
}

check('eslint', 'npx', ['eslint', '--max-warnings=0', '.']);
check('prettier', 'npx', ['prettier', '--check', '.']);
// Unused files, exports and dependencies of every workspace (knip.json).
check('knip', 'npx', ['knip', '--no-progress']);
// Generated files must match what generates them: the numpy/scipy reference fixtures and the
// OpenAPI schemas of the shared API types.
check('scipy fixtures', 'bash', ['backend/scripts/check-fixtures.sh']);
check('OpenAPI schemas', 'node', ['backend/scripts/api-schemas.mjs', '--check']);
for (const workspace of ['shared', 'backend', 'frontend', 'seed']) {
  check(`tsc ${workspace}`, 'npx', ['tsc', '--noEmit', '-p', `${workspace}/tsconfig.json`]);
}
suite('shared jest', 'npx', ['jest', '--ci'], join(root, 'shared'));
// Two workers: on a 2-core machine jest would run every suite in one process one after
// another, while an API suite mostly waits (sockets, timers, worker threads); measured in
// docs/performance.md ("Test run time").
suite('backend jest', 'npx', ['jest', '--ci', '--maxWorkers=2'], join(root, 'backend'));
suite('seed jest', 'npx', ['jest', '--ci'], join(root, 'seed'));
vitestSuite('frontend vitest', [], join(root, 'frontend'));
vitestSuite(
  'frontend e2e (Chromium)',
  ['--config', 'vitest.e2e.config.ts'],
  join(root, 'frontend'),
);

rmSync(reports, { recursive: true, force: true });
console.log('\nSummary (seconds per step, then the load average at the end):');
for (const result of results) {
  console.log(
    `  ${result.failed === 0 ? 'ok  ' : 'FAIL'} ${result.seconds.toFixed(0).padStart(5)} s  ${result.name}: ${result.passed} passed, ${result.failed} failed`,
  );
}
const totalSeconds = results.reduce((sum, r) => sum + r.seconds, 0);
console.log(
  `  ${totalSeconds.toFixed(0)} s in all; load average ${loadavg()
    .map((v) => v.toFixed(2))
    .join(' ')}`,
);
const passed = results.reduce((sum, r) => sum + r.passed, 0);
const failed = results.reduce((sum, r) => sum + r.failed, 0);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);
