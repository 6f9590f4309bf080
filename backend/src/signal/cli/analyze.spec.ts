import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { writeEdf } from '../edf/edf-writer';
import { bootstrapMeanInterval } from '../trials/onset-statistics';
import { BOOTSTRAP_RESAMPLES, BOOTSTRAP_SEED } from '../pipeline/analysis-settings';
import type { RunSummary } from '../pipeline/run-summary';
import { syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import { analyzeCliReport, runAnalyzeCli as run } from '../testing/analyze-cli';
import { scratchFolder } from '../testing/scratch-folder';
import type { ConditionDifferenceView, CycleEstimateView } from '@gyre/shared';

interface Report {
  kind: string;
  iafHz: number | null;
  settings: { bandHz: number[] | null; method: string; roi: string[]; onsetLabel: string | null };
  computation: { bootstrapSeed: number; morletCentreHz: number | null };
  conditions?: {
    label: string;
    deltaFHz: number | null;
    ciHz: [number, number] | null;
    pValue: number | null;
    trialsKept: number;
    trialsTotal: number;
  }[];
  conditionDifference?: ConditionDifferenceView | null;
  phaseBased?: RunSummary['roi'];
  cycleByCycle?: CycleEstimateView | null;
  summary: RunSummary;
  series?: Record<string, (number | null)[]>;
}

const report = analyzeCliReport<Report>;

describe('analyze CLI', () => {
  const { dir, remove } = scratchFolder('gyre-cli-');
  afterAll(remove);

  // Generated EDF+ task recording, written to the spec: the frequency is 10 Hz, and 9.4 Hz
  // from +0.2 to +0.8 s after each onset, so Δf = −0.6 Hz by construction.
  const onsetsS = Array.from({ length: 20 }, (_, i) => 3 + 4 * i);
  const recording = syntheticTaskRecording({
    sampleRateHz: 250,
    durationS: 86,
    channelLabels: ['EEG O1-REF', 'EEG O2-REF', 'EEG Cz-REF'],
    onsetsS,
    seed: 5,
  });
  const annotations = onsetsS.map((t, i) => ({
    onsetS: t,
    durationS: null,
    text: i % 2 === 0 ? 'go' : 'nogo',
  }));
  const edfPath = join(dir, 'task.edf');
  writeFileSync(
    edfPath,
    writeEdf({
      startDate: '2024-03-01T10:00:00',
      signals: recording.signals.map((s) => ({
        label: s.label,
        sampleRateHz: s.sampleRateHz,
        physicalMin: -500,
        physicalMax: 500,
        samples: s.samples,
      })),
      annotations,
    }),
  );

  it('prints the task RunSummary as JSON, Δf near the generated −0.6 Hz', async () => {
    const r = await report([edfPath]);
    expect(r.kind).toBe('task');
    expect(r.summary.channels.map((c) => c.label)).toEqual([
      'EEG O1-REF',
      'EEG O2-REF',
      'EEG Cz-REF',
    ]);
    expect(r.summary.channels.map((c) => c.inRoi)).toEqual([true, true, false]);
    expect(r.summary.roi?.trialsKept).toBe(20);
    expect(Math.abs((r.summary.roi?.deltaFHz as number) + 0.6)).toBeLessThan(0.05);
    expect(r.summary.roi?.ciHz).toHaveLength(2);
    expect(r.summary.task?.trialOnsetsS).toEqual(onsetsS);
    expect(r.summary.quality.sampleRatesHz).toEqual([250]);
    expect(r.summary.bandHz).toEqual([8, 13]);
    expect(r.summary.bandSource).toBe('default');
    expect(r.summary.roiUsage.used).toEqual(['EEG O1-REF', 'EEG O2-REF']);
    // Default region: the posterior names the montage lacks are no doubt about the number.
    expect(r.summary.roiUsage.status).toBe('complete');
  });

  it('bootstraps with the seed every caller uses', async () => {
    const r = await report([edfPath, '--full']);
    expect(r.computation.bootstrapSeed).toBe(BOOTSTRAP_SEED);
    // The printed interval is the percentile bootstrap of the printed trial Δf values with
    // the shared seed and resamples (Efron & Tibshirani 1993).
    const trials = (r.series?.trialDeltaFHz ?? []) as number[];
    expect(trials).toHaveLength(20);
    expect(r.summary.roi?.ciHz).toEqual(
      bootstrapMeanInterval(trials, { seed: BOOTSTRAP_SEED, resamples: BOOTSTRAP_RESAMPLES }),
    );
    expect(r.summary.roi?.ciHz).not.toEqual(
      bootstrapMeanInterval(trials, { seed: 1, resamples: BOOTSTRAP_RESAMPLES }),
    );
  });

  it('chooses onsets by label and from a CSV', async () => {
    const byLabel = await report([edfPath, '--onset-label', 'go']);
    expect(byLabel.summary.roi?.trialsKept).toBe(10);
    const csvPath = join(dir, 'onsets.csv');
    writeFileSync(
      csvPath,
      'onset_s,label\n' +
        onsetsS
          .slice(0, 5)
          .map((t) => `${t},cue`)
          .join('\n'),
    );
    const fromCsv = await report([edfPath, '--onsets', csvPath]);
    expect(fromCsv.summary.roi?.trialsKept).toBe(5);
  });

  it('reports every condition and the difference of the first two without a flag', async () => {
    const r = await report([edfPath]);
    // Both labels dip by the generated −0.6 Hz: each condition's Δf is near it and their
    // difference near 0 (by construction).
    expect(r.conditions?.map((c) => [c.label, c.trialsKept, c.trialsTotal])).toEqual([
      ['go', 10, 10],
      ['nogo', 10, 10],
    ]);
    for (const c of r.conditions ?? []) {
      expect(Math.abs((c.deltaFHz as number) + 0.6)).toBeLessThan(0.05);
      expect(c.ciHz).toHaveLength(2);
      expect(c.pValue).toBeLessThan(0.01);
    }
    const difference = r.conditionDifference;
    expect(difference).toMatchObject({ first: 'go', second: 'nogo', chosenBy: 'first-two' });
    expect(Math.abs(difference?.differenceHz as number)).toBeLessThan(0.05);
    // C(20, 10) = 184756 splits: 5000 random ones.
    expect(difference?.permutations).toBe(5000);
    expect(difference?.pValue).toBeGreaterThan(0.05);
    expect(r.summary.task?.conditions.map((c) => c.deltaFHz)).toEqual(
      r.conditions?.map((c) => c.deltaFHz),
    );
  });

  it('compares the conditions --compare names, else those of the settings file', async () => {
    const requested = await report([edfPath, '--compare', 'NOGO,go']);
    expect(requested.conditionDifference).toMatchObject({
      first: 'nogo',
      second: 'go',
      chosenBy: 'request',
    });
    const settingsPath = join(dir, 'compare.json');
    writeFileSync(settingsPath, JSON.stringify({ compareConditions: ['nogo', 'go'] }));
    const fromSettings = await report([edfPath, '--settings', settingsPath]);
    expect(fromSettings.conditionDifference).toMatchObject({ first: 'nogo', chosenBy: 'settings' });
    expect(fromSettings.conditionDifference?.differenceHz).toBe(
      requested.conditionDifference?.differenceHz,
    );
    const oneLabel = await report([edfPath, '--onset-label', 'go']);
    expect(oneLabel.conditions?.map((c) => c.label)).toEqual(['go']);
    expect(oneLabel.conditionDifference).toBeNull();
    expect((await report([edfPath, '--kind', 'resting'])).conditions).toBeUndefined();
  });

  it('exits 2 naming an unknown --compare label and the labels found', async () => {
    const unknown = await run([edfPath, '--compare', 'go,click']);
    expect(unknown.code).toBe(2);
    expect(unknown.stdout).toBe('');
    expect(unknown.stderr).toBe(
      'analyze: --compare: no onsets labelled "click"; conditions found: "go", "nogo"\n',
    );
    const one = await run([edfPath, '--compare', 'go']);
    expect(one.code).toBe(2);
    expect(one.stderr).toMatch(/--compare: expected two different onset labels as A,B, got "go"/);
    expect((await run([edfPath, '--compare', 'go,GO'])).code).toBe(2);
  });

  it('takes the band from --band, else from --iaf (IAF ± 2 Hz)', async () => {
    const banded = await report([edfPath, '--band', '7.5,12.5', '--iaf', '10']);
    expect(banded.summary.bandHz).toEqual([7.5, 12.5]);
    expect(banded.summary.bandSource).toBe('settings');
    const byIaf = await report([edfPath, '--iaf', '9.6', '--method', 'morlet']);
    expect(byIaf.summary.bandHz).toEqual([7.6, 11.6]);
    expect(byIaf.summary.bandSource).toBe('iaf');
    expect(byIaf.computation.morletCentreHz).toBe(9.6);
  });

  it('reads a settings file, then the single flags over it', async () => {
    const settingsPath = join(dir, 'settings.json');
    writeFileSync(settingsPath, JSON.stringify({ roi: ['Cz'], bandHz: [8, 12] }));
    const r = await report([edfPath, '--settings', settingsPath, '--band', '8,13']);
    expect(r.settings.roi).toEqual(['Cz']);
    expect(r.summary.bandHz).toEqual([8, 13]);
    expect(r.summary.roiUsage).toEqual({
      wanted: ['Cz'],
      used: ['EEG Cz-REF'],
      leftOut: [],
      status: 'complete',
    });
    expect((await report([edfPath, '--roi', 'O1'])).summary.roi?.deltaFHz).toBe(
      (await report([edfPath, '--roi', 'O1', '--kind', 'task'])).summary.channels[0].deltaFHz,
    );
  });

  it('gives the cycle-by-cycle Δf beside the phase-based one without a flag', async () => {
    const r = await report([edfPath]);
    // Two estimates of one kind under names that say which is which.
    expect(r.phaseBased).toEqual(r.summary.roi);
    expect(r.cycleByCycle).toEqual(r.summary.task?.cycles);
    const phaseDeltaF = r.phaseBased?.deltaFHz as number;
    expect(Math.abs(phaseDeltaF + 0.6)).toBeLessThan(0.05);
    // Generated sinusoidal alpha, Δf = −0.6 Hz by construction: both estimates find it.
    expect(Math.abs((r.cycleByCycle?.deltaFHz as number) + 0.6)).toBeLessThan(0.05);
    expect(r.cycleByCycle?.disagreementHz).toBeCloseTo(
      Math.abs((r.cycleByCycle?.deltaFHz as number) - phaseDeltaF),
      12,
    );
    expect(r.cycleByCycle?.trialsTotal).toBe(20);
  });

  it('takes --amplitude-gate and --cycle-disagreement into the settings', async () => {
    const r = await report([edfPath, '--amplitude-gate', '25', '--cycle-disagreement', '0.3']);
    expect(r.settings).toMatchObject({ amplitudeGatePercentile: 25, cycleDisagreementHz: 0.3 });
    const o1 = r.summary.channels[0].amplitudeGate;
    expect(o1?.percentile).toBe(25);
    // A quarter of the values lie under the 25th percentile of their own envelope.
    expect(Math.abs((o1?.excludedSamples ?? 0) / (o1?.totalSamples ?? 1) - 0.25)).toBeLessThan(
      1e-3,
    );
    const off = await report([edfPath, '--amplitude-gate', 'off']);
    expect(off.settings).toMatchObject({ amplitudeGatePercentile: null });
    expect(off.summary.channels[0].amplitudeGate).toBeNull();
    const badGate = await run([edfPath, '--amplitude-gate', '95']);
    expect(badGate.code).toBe(2);
    expect(badGate.stderr).toMatch(/--amplitude-gate: expected a percentile from 1 to 90 or off/);
    const badHz = await run([edfPath, '--cycle-disagreement', '0']);
    expect(badHz.code).toBe(2);
    expect(badHz.stderr).toMatch(/--cycle-disagreement: expected 0 < HZ ≤ 2, got 0/);
  });

  it('reads a resting recording as such with --kind resting', async () => {
    const r = await report([edfPath, '--kind', 'resting']);
    expect(r.kind).toBe('rest');
    expect(r.summary.roi).toBeNull();
    expect(r.summary.rest?.alphaWindowHz).toEqual([7, 13]);
    // Each channel's own peak: the generated alpha is 10 Hz outside the dips (0.25 Hz bins).
    for (const channel of r.summary.channels) {
      expect(Math.abs((channel.pafHz as number) - 10)).toBeLessThanOrEqual(0.25);
      expect(channel.cogHz).not.toBeNull();
    }
  });

  it('exits 1 with the reader message for a bad file', async () => {
    const badPath = join(dir, 'bad.edf');
    writeFileSync(badPath, Buffer.from('not an EDF file at all'));
    const { code, stdout, stderr } = await run([badPath]);
    expect(code).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toMatch(/^analyze: .+ found, .+ expected/);
  });

  it('exits 1 for a task without onsets, 2 for a bad option', async () => {
    expect((await run([edfPath, '--onset-label', 'absent', '--kind', 'task'])).code).toBe(1);
    const bad = await run([edfPath, '--band', '13']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--band: expected 2 number/);
    const oldMethod = await run([edfPath, '--method', 'plateau']);
    expect(oldMethod.code).toBe(2);
    expect(oldMethod.stderr).toMatch(/--method: expected filter or morlet, got "plateau"/);
    const settingsPath = join(dir, 'unknown.json');
    writeFileSync(settingsPath, JSON.stringify({ epochS: [-1, 2] }));
    const unknown = await run([edfPath, '--settings', settingsPath]);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/unknown setting\(s\) epochS/);
  });

  it('parses with node:util parseArgs: --help, unknown options, missing values, one file', async () => {
    const help = await run(['--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/^usage: analyze FILE\.edf \[--onsets FILE\.csv\]/);
    // Every option has a line of its own saying what it does (common practice for --help).
    for (const option of ['compare', 'amplitude-gate', 'cycle-disagreement', 'settings', 'roi']) {
      expect(help.stdout).toMatch(new RegExp(`^  --${option} \\S*\\s+\\w`, 'm'));
    }
    const unknown = await run([edfPath, '--bogus']);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/^analyze: Unknown option '--bogus'/);
    expect(unknown.stderr).toContain('usage: analyze');
    const missing = await run([edfPath, '--iaf']);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/--iaf/);
    const two = await run([edfPath, edfPath]);
    expect(two.code).toBe(2);
    expect(two.stderr).toMatch(/one recording expected/);
    expect((await run([])).stderr).toMatch(/no recording given/);
    // --name=value is parseArgs' other spelling of the same option.
    const r = await report([edfPath, '--kind=resting', '--band=8,12']);
    expect(r.kind).toBe('rest');
    expect(r.settings.bandHz).toEqual([8, 12]);
  });
});
