/**
 * A small `npm run crash-test` in the suite: the built CLI (dist/robustness/cli/crash-test.js)
 * SIGKILLs the built server 3 times at seeded moments while clients upload and re-run, restarts
 * it on the same data folder, lets it settle and checks what is left
 * (src/robustness/crash/crash-checks.ts); this test reads its JSON report. The CLI runs in a
 * process of its own because jest's module sandbox makes generating the recordings ~30 times
 * slower. The full run (20 kills) and its figures are in docs/reliability.md.
 */
import { rmSync } from 'node:fs';
import { builtCliReport } from './helpers/built-dist';
import type { CrashTestReport } from '../src/robustness/crash/crash-test';
import { formatCrashReport } from '../src/robustness/crash/crash-test';
import type { UploadRaceResult } from '../src/robustness/crash/upload-race-probe';

describe('a server killed 3 times during uploads and computations', () => {
  let report: CrashTestReport;

  beforeAll(() => {
    report = builtCliReport<CrashTestReport>(
      'backend/dist/robustness/cli/crash-test.js',
      ['--kills', '3', '--quick', '--probe-upload-race'],
      150_000,
      'the crash test',
    );
  }, 170_000);

  it('kills the server while work is in progress', () => {
    expect(report.kills).toHaveLength(3);
    // Kills that found nothing running would test nothing.
    const inProgress = report.kills.reduce(
      (n, k) => n + k.jobsRunningAtKill + k.uploadsInFlight,
      0,
    );
    expect(inProgress).toBeGreaterThan(0);
    expect(report.uploads.byStatus['201'] ?? 0).toBeGreaterThanOrEqual(2);
  });

  it('leaves nothing transient, no orphan, every accepted upload ready and the audit chain intact', () => {
    // A kill between storing an accepted file and committing its acceptance once left the file
    // behind; the restart now removes a stored file no accepted recording names.
    const problems = report.check.problems;
    if (problems.length === 0) rmSync(report.dataDir, { recursive: true, force: true });
    // On failure the whole report is the message: the problems, the seed and the kept data folder.
    expect(problems.length === 0 ? 'none' : formatCrashReport(report, 'jest')).toBe('none');
    expect(report.check.finalStates.ready ?? 0).toBeGreaterThanOrEqual(2);
    expect(report.check.auditEntriesChecked).toBeGreaterThan(0);
  });

  it('accepts one of two concurrent uploads of a kind to one visit and refuses the other', () => {
    const race = report.probe as UploadRaceResult;
    expect(race).toMatchObject({ collided: true, statuses: [201, 409] });
    expect(race.refused?.state).toBe('rejected');
  });

  // The refused upload's file was moved into uploads/ before the database refused it; it is
  // now removed when the transaction fails.
  it('keeps no file of the refused concurrent upload', () => {
    expect((report.probe as UploadRaceResult).refused?.fileKept).toBe(false);
  });
});
