/**
 * One computation, two doors: `npm run analyze` on a file and the server on the same upload
 * give bit-identical numbers (same settings, same resting IAF, same bootstrap seed). The
 * command runs as a user runs it, through npm, which builds the backend first.
 * Recordings are generated (recordings-fixtures.ts).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import request from 'supertest';
import type { RecordingView, RecordingResultsView } from '@gyre/shared';
import type { RunSummary } from '../src/signal/pipeline/run-summary';
import { startTestApp, TestApp } from './helpers/test-app';
import { syntheticRestEdf, syntheticTaskEdf, upload, waitForState } from './recordings-fixtures';

const REPO = resolve(__dirname, '..', '..');

describe('npm run analyze against the API', () => {
  let t: TestApp;
  let folder: string;

  beforeAll(async () => {
    t = await startTestApp();
    folder = mkdtempSync(join(tmpdir(), 'gyre-cli-'));
  });
  afterAll(async () => {
    await t.close();
    rmSync(folder, { recursive: true, force: true });
  });

  it('gives the numbers the server stored for the same task file and resting IAF', async () => {
    const task = syntheticTaskEdf({ durationS: 60, baseFrequencyHz: 9.1, dipHz: -0.5, seed: 61 });
    const rest = syntheticRestEdf({ durationS: 60, peakHz: 9.1, seed: 62 });
    const visitId = t.seed.visits.A1.id;
    const restUp = await upload(t, 'technician', visitId, { kind: 'resting', bytes: rest });
    const taskUp = await upload(t, 'technician', visitId, { kind: 'task', bytes: task });
    expect([restUp.status, taskUp.status]).toEqual([201, 201]);
    await t.computationsIdle();
    const restReady = await waitForState(t, 'technician', (restUp.body as RecordingView).id, [
      'ready',
    ]);
    const taskReady = await waitForState(t, 'technician', (taskUp.body as RecordingView).id, [
      'ready',
    ]);
    const analyst = await t.authHeader('analyst');
    const restResults = (
      await request(t.url).get(`/api/recordings/${restReady.id}/results`).set(analyst)
    ).body as RecordingResultsView;
    const api = (await request(t.url).get(`/api/recordings/${taskReady.id}/results`).set(analyst))
      .body as RecordingResultsView;
    const iaf = restResults.run.pafHz as number;
    expect(api.run.bandSource).toBe('iaf');

    const file = join(folder, 'task.edf');
    writeFileSync(file, task);
    // String(number) round-trips a double exactly (ECMAScript Number::toString).
    const stdout = execFileSync(
      'npm',
      ['run', '-s', 'analyze', '--', file, '--kind', 'task', '--iaf', String(iaf)],
      { cwd: REPO, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 },
    );
    const cli = JSON.parse(stdout) as { summary: RunSummary };

    expect(cli.summary.bandHz).toEqual(api.run.bandHz);
    expect(cli.summary.roi?.deltaFHz).toBe(api.run.roiDeltaFHz);
    expect(cli.summary.roi?.ciHz).toEqual(api.run.roiCiHz);
    expect(cli.summary.roi?.pValue).toBe(api.run.roiPValue);
    expect(cli.summary.roi?.trialsKept).toBe(api.run.trialsKept);
    expect(cli.summary.channels).toEqual(api.channels);
    expect(cli.summary.roiUsage).toEqual(api.run.roiUsage);
    expect(cli.summary.suggestsSlowing).toBe(api.run.suggestsSlowing);
    // Generated truth: a 0.5 Hz dip in the post window.
    expect(Math.abs((api.run.roiDeltaFHz as number) + 0.5)).toBeLessThan(0.05);
  }, 300_000);
});
