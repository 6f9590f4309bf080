import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { DEFAULT_ANALYSIS_SETTINGS } from '../../signal/pipeline/analysis-settings';
import { syntheticEdf, syntheticTaskRecording } from '../../signal/synthetic/synthetic-eeg';
import { analyzeCliReport } from '../../signal/testing/analyze-cli';
import { scratchFolder } from '../../signal/testing/scratch-folder';
import { runAnalysis } from './run-analysis';

/** JSON as the CLI prints it: typed arrays as arrays, NaN as null. */
const asJson = (value: unknown): unknown =>
  JSON.parse(
    JSON.stringify(value, (_k, v: unknown) =>
      ArrayBuffer.isView(v) && !(v instanceof DataView) ? Array.from(v as Float64Array) : v,
    ),
  );

describe('runAnalysis (worker) and the analyze command line', () => {
  const { write, remove } = scratchFolder('gyre-run-');
  afterAll(remove);

  // Generated EDF+ task recording: Δf = −0.6 Hz by construction (see synthetic-eeg.ts), with
  // a non-10-10 signal (ECG) the worker never decodes.
  const onsetsS = Array.from({ length: 16 }, (_, i) => 3 + 4 * i);
  const generated = syntheticTaskRecording({
    sampleRateHz: 250,
    durationS: 70,
    channelLabels: ['O1', 'O2', 'Oz', 'Pz', 'ECG'],
    onsetsS,
    seed: 12,
  });
  const path = write('task.edf', syntheticEdf(generated, { startDate: '2024-05-06T09:00:00' }));
  const checksumSha256 = createHash('sha256').update(readFileSync(path)).digest('hex');

  it.each([
    ['default settings, no IAF', { ...DEFAULT_ANALYSIS_SETTINGS }, null, []],
    [
      'Morlet with an IAF and a custom region',
      { ...DEFAULT_ANALYSIS_SETTINGS, method: 'morlet' as const, roi: ['O1', 'Oz', 'PO7'] },
      9.8,
      ['--iaf', '9.8', '--method', 'morlet', '--roi', 'O1,Oz,PO7'],
    ],
  ])(
    'give bit-identical numbers for the same file, settings and IAF (%s)',
    async (_n, settings, iafHz, flags) => {
      const progress: number[] = [];
      const outcome = await runAnalysis(
        { filePath: path, checksumSha256, kind: 'task', csvOnsets: null, settings, iafHz },
        (p) => progress.push(p),
      );
      const cli = await analyzeCliReport<Record<string, unknown>>([
        path,
        '--kind',
        'task',
        '--full',
        ...flags,
      ]);
      expect(cli.summary).toEqual(asJson(outcome.summary));
      expect(cli.series).toEqual(asJson(outcome.series));
      expect(progress[progress.length - 1]).toBeCloseTo(99, 9);
      // Generated truth: Δf = −0.6 Hz (the filter); the Morlet run only has to agree with the CLI.
      if (settings.method === 'filter') {
        expect(Math.abs((outcome.summary.roi?.deltaFHz as number) + 0.6)).toBeLessThan(0.05);
      }
    },
  );

  it('takes the settings and IAF as given and reports the band it resolved', async () => {
    const outcome = await runAnalysis(
      {
        filePath: path,
        checksumSha256,
        kind: 'task',
        csvOnsets: onsetsS.slice(0, 8).map((onsetS) => ({ onsetS, label: 'cue' })),
        settings: { ...DEFAULT_ANALYSIS_SETTINGS, roi: ['O1', 'O2', 'Oz', 'Pz'] },
        iafHz: 10.1,
      },
      () => undefined,
    );
    expect(outcome.summary.bandHz).toEqual([8.1, 12.1]);
    expect(outcome.summary.bandSource).toBe('iaf');
    expect(outcome.summary.roi?.trialsTotal).toBe(8);
    expect(outcome.summary.roiUsage.status).toBe('complete');
    // Only 10-10 electrodes are decoded and analysed; ECG is not one.
    expect(outcome.summary.channels.map((c) => c.label)).toEqual(['O1', 'O2', 'Oz', 'Pz']);
  });

  it('refuses a file that no longer hashes to the run checksum', async () => {
    await expect(
      runAnalysis(
        {
          filePath: path,
          checksumSha256: '0'.repeat(64),
          kind: 'task',
          csvOnsets: null,
          settings: { ...DEFAULT_ANALYSIS_SETTINGS },
          iafHz: null,
        },
        () => undefined,
      ),
    ).rejects.toThrow(/SHA-256 [0-9a-f]{64} found, 0{64} expected/);
  });
});
