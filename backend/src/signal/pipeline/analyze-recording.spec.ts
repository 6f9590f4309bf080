import { DEFAULT_POSTERIOR_ROI } from '../channels';
import { syntheticRestRecording, syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import {
  AnalysisSettings,
  BOOTSTRAP_RESAMPLES,
  BOOTSTRAP_SEED,
  DEFAULT_ANALYSIS_SETTINGS,
} from './analysis-settings';
import type { AnalysisContext } from './analysis.types';
import { analyzeRecording, AnalysisInputError } from './analyze-recording';

const settings = (changes: Partial<AnalysisSettings> = {}): AnalysisSettings => ({
  ...DEFAULT_ANALYSIS_SETTINGS,
  ...changes,
});
const AUTO: AnalysisContext = { kind: 'auto', iafHz: null };

// Generated test data (see synthetic-eeg.ts): known answers by construction. The task's
// frequency is 10 Hz, and 9.4 Hz over +0.2…+0.8 s after each onset, so Δf = −0.6 Hz exactly
// between Gyre's default baseline (−0.5…0 s) and post (+0.2…+0.8 s) windows.
const onsetsS = Array.from({ length: 60 }, (_, i) => 3 + 4 * i);
const task = syntheticTaskRecording({
  sampleRateHz: 250,
  durationS: 245,
  channelLabels: ['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF', 'EEG Fz-REF', 'ECG'],
  onsetsS,
  dipHz: -0.6,
  noiseUv: 3,
  seed: 7,
});

describe('analyzeRecording on a generated task recording (Δf = −0.6 Hz by construction)', () => {
  const fractions: number[] = [];
  const result = analyzeRecording(task, DEFAULT_ANALYSIS_SETTINGS, {
    ...AUTO,
    onProgress: (f) => fractions.push(f),
  });

  it('recovers Δf within 0.03 Hz per channel and over the region of interest', () => {
    expect(result.kind).toBe('task');
    expect(result.channels.map((c) => c.label)).toEqual([
      'EEG O1-REF',
      'EEG O2-REF',
      'EEG Pz-REF',
      'EEG Fz-REF',
    ]);
    for (const c of result.channels) {
      expect(Math.abs((c.deltaFHz as number) + 0.6)).toBeLessThan(0.03);
      expect(Math.abs((c.baselineHz as number) - 10)).toBeLessThan(0.03);
    }
    const roi = result.roi;
    expect(roi).not.toBeNull();
    expect(roi?.channels).toEqual(['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF']);
    expect(Math.abs((roi?.deltaFHz as number) + 0.6)).toBeLessThan(0.03);
  });

  it('suggests the slowing, with an interval below zero and a small p', () => {
    const roi = result.roi;
    expect(roi?.suggestsSlowing).toBe(true);
    expect((roi?.ciHz as [number, number])[1]).toBeLessThan(0);
    expect(roi?.pValue as number).toBeLessThan(1e-6);
    expect(roi?.trialsKept).toBe(60);
    expect(roi?.trialsDropped).toBe(0);
    expect(roi?.trialOnsetsS).toEqual(onsetsS);
  });

  it('uses 8–13 Hz without an IAF and records the bootstrap constants', () => {
    // Gyre's rule: no fixed band and no resting IAF → the alpha band 8–13 Hz (common practice).
    expect(result.bandHz).toEqual([8, 13]);
    expect(result.bandSource).toBe('default');
    expect(result.computation.bootstrapSeed).toBe(BOOTSTRAP_SEED);
    expect(result.computation.bootstrapResamples).toBe(BOOTSTRAP_RESAMPLES);
    expect(result.computation.morletCentreHz).toBeNull();
  });

  it('says which region channels it used and lists the default names the montage lacks', () => {
    const missing = DEFAULT_POSTERIOR_ROI.filter((n) => !['O1', 'O2', 'Pz'].includes(n));
    // The default posterior set means "those present" (docs/method.md §1): complete, no warning.
    expect(result.roiUsage).toEqual({
      wanted: [...DEFAULT_POSTERIOR_ROI],
      used: ['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF'],
      leftOut: missing.map((label) => ({ label, reason: 'missing' })),
      status: 'complete',
    });
    expect(result.warnings.some((w) => w.startsWith('Region-of-interest channels'))).toBe(false);
    expect(result.channels.map((c) => c.inRoi)).toEqual([true, true, true, false]);
  });

  it("warns about a missing channel of a study's own region of interest", () => {
    const own = analyzeRecording(
      task,
      { ...DEFAULT_ANALYSIS_SETTINGS, roi: ['O1', 'O2', 'Oz'] },
      { kind: 'task', iafHz: null },
    );
    expect(own.roiUsage).toMatchObject({
      used: ['EEG O1-REF', 'EEG O2-REF'],
      leftOut: [{ label: 'Oz', reason: 'missing' }],
      status: 'partial',
    });
    const warning = own.warnings.find((w) => w.startsWith('Region-of-interest channels'));
    expect(warning).toContain('Oz (not in the file)');
  });

  it('returns the onset curve and a raster of at most 500 points', () => {
    const roi = result.roi;
    expect(roi?.curve.timesS.length).toBeLessThanOrEqual(500);
    expect(roi?.raster.length).toBe((roi?.rasterTrials as number) * (roi?.rasterPoints as number));
    const times = roi?.curve.timesS as Float64Array;
    const mean = roi?.curve.meanHz as Float64Array;
    const at = (t: number): number => mean[times.findIndex((x) => x >= t)];
    expect(at(0.5)).toBeLessThan(at(-0.25) - 0.5);
  });

  it('reports progress up to 1 and the quality checks', () => {
    expect(fractions[fractions.length - 1]).toBe(1);
    expect(fractions.every((f, i) => i === 0 || f >= fractions[i - 1])).toBe(true);
    expect(result.qc.sampleRatesHz).toEqual([250]);
    expect(result.qc.roiChannelsFound).toEqual(['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF']);
    expect(result.qc.flatChannels).toEqual([]);
    expect(result.qc.saturatedChannels).toEqual([]);
    expect(result.qc.epochsDroppedShare).toBe(0);
    expect(result.qc.phaseSlipShare as number).toBeLessThan(0.05);
  });
});

describe('analyzeRecording: the band and the wavelet centre follow the settings and the IAF', () => {
  const short = syntheticTaskRecording({
    sampleRateHz: 250,
    durationS: 45,
    channelLabels: ['O1', 'O2'],
    onsetsS: Array.from({ length: 10 }, (_, i) => 3 + 4 * i),
    seed: 9,
  });

  it('takes IAF ± 2 Hz without a fixed band, and the fixed band when the settings have one', () => {
    // Gyre's rule (common practice): the individual band is the resting IAF ± 2 Hz.
    const byIaf = analyzeRecording(short, settings(), { kind: 'task', iafHz: 10.2 });
    expect(byIaf.bandHz).toEqual([8.2, 12.2]);
    expect(byIaf.bandSource).toBe('iaf');
    const fixed = analyzeRecording(short, settings({ bandHz: [7, 14] }), {
      kind: 'task',
      iafHz: 10.2,
    });
    expect(fixed.bandHz).toEqual([7, 14]);
    expect(fixed.bandSource).toBe('settings');
  });

  it('centres the Morlet wavelet on the IAF when known, else on the band centre', () => {
    const morlet = settings({ method: 'morlet' });
    const withIaf = analyzeRecording(short, morlet, { kind: 'task', iafHz: 9.7 });
    expect(withIaf.computation.morletCentreHz).toBe(9.7);
    const without = analyzeRecording(short, morlet, { kind: 'task', iafHz: null });
    expect(without.computation.morletCentreHz).toBe((8 + 13) / 2);
    // A different centre is a different wavelet: the per-channel frequency differs.
    expect(withIaf.channels[0].baselineHz).not.toBe(without.channels[0].baselineHz);
  });

  it('refuses settings it cannot compute with, naming the field', () => {
    expect(() =>
      analyzeRecording(short, settings({ postWindowS: [0.2, 3] }), { kind: 'task', iafHz: null }),
    ).toThrow(/postWindowS: \[0\.2,3\] found, a window inside the epoch \[-1,2\] expected/);
    expect(() =>
      analyzeRecording(short, settings({ bandHz: [13, 8] }), { kind: 'task', iafHz: null }),
    ).toThrow(AnalysisInputError);
  });
});

describe('analyzeRecording: epochs dropped with reasons', () => {
  it('drops epochs near the edges, over artefacts and above ±100 µV', () => {
    const recording = syntheticTaskRecording({
      sampleRateHz: 250,
      durationS: 60,
      channelLabels: ['O1', 'O2'],
      onsetsS: [1.5, 10, 20, 30, 40, 58.5],
      seed: 3,
    });
    // A 300 µV blink-like bump on O1 inside the epoch of the onset at 30 s.
    const o1 = recording.signals[0].samples;
    for (let i = 0; i < 50; i++) o1[30.5 * 250 + i] += 300 * Math.sin((Math.PI * i) / 50);
    const annotations = [
      ...(recording.annotations ?? []),
      { onsetS: 19.5, durationS: 1, text: 'Artefact: movement' },
    ];
    const result = analyzeRecording({ ...recording, annotations }, DEFAULT_ANALYSIS_SETTINGS, {
      kind: 'task',
      iafHz: null,
    });
    const [c1, c2] = result.channels;
    expect(c1.dropReasons).toEqual({ edge: 2, amplitude: 1, artefact: 1 });
    expect(c1.trialsKept).toBe(2);
    expect(c2.dropReasons).toEqual({ edge: 2, amplitude: 0, artefact: 1 });
    expect(c2.trialsKept).toBe(3);
    // The artefact annotation is not an onset.
    expect(result.computation.onsetCount).toBe(6);
  });

  it('says so when a task analysis finds no onsets of the chosen label', () => {
    const recording = syntheticTaskRecording({
      sampleRateHz: 250,
      durationS: 20,
      channelLabels: ['O1'],
      onsetsS: [5, 10],
    });
    const run = (): unknown =>
      analyzeRecording(recording, settings({ onsetLabel: 'target' }), {
        kind: 'task',
        iafHz: null,
      });
    expect(run).toThrow(AnalysisInputError);
    expect(run).toThrow(/found none labelled "target" in the annotations/);
  });
});

describe('analyzeRecording on a generated resting recording (peak at 10.4 Hz by construction)', () => {
  const rest = syntheticRestRecording({
    sampleRateHz: 250,
    durationS: 180,
    channelLabels: ['O1', 'O2', 'Oz', 'Cz'],
    peakHz: 10.4,
    seed: 11,
  });
  const roi3 = settings({ roi: ['O1', 'O2', 'Oz'] });
  const result = analyzeRecording(rest, roi3, AUTO);

  it('finds PAF within 0.05 Hz and a CoG in the alpha band', () => {
    expect(result.kind).toBe('rest');
    expect(result.channels).toEqual([]);
    expect(result.rest).not.toBeNull();
    expect(Math.abs((result.rest?.pafHz as number) - 10.4)).toBeLessThan(0.05);
    expect(result.rest?.cogHz as number).toBeGreaterThan(9.5);
    expect(result.rest?.cogHz as number).toBeLessThan(11);
    expect(result.rest?.channels).toEqual(['O1', 'O2', 'Oz']);
    expect(result.roiUsage.status).toBe('complete');
    expect(result.qc.alphaPeakProminenceDb as number).toBeGreaterThan(3);
  });

  it('leaves a flat channel out of the region with the reason "flat"', () => {
    const flat = {
      ...rest,
      signals: rest.signals.map((s, i) =>
        i === 1 ? { ...s, samples: new Float32Array(s.samples.length) } : s,
      ),
    };
    const r = analyzeRecording(flat, roi3, AUTO);
    expect(r.qc.flatChannels).toEqual(['O2']);
    expect(r.rest?.channels).toEqual(['O1', 'Oz']);
    expect(r.roiUsage).toEqual({
      wanted: ['O1', 'O2', 'Oz'],
      used: ['O1', 'Oz'],
      leftOut: [{ label: 'O2', reason: 'flat' }],
      status: 'partial',
    });
    expect(r.warnings).toContain('Region-of-interest channels left out: O2 (flat).');
  });

  it('leaves a channel at another sampling rate out with the reason "sample-rate"', () => {
    // Oz resampled to 500 Hz by repeating each sample: same content, another time grid.
    const oz = rest.signals[2];
    const doubled = Float32Array.from(
      { length: oz.samples.length * 2 },
      (_, i) => oz.samples[i >> 1],
    );
    const mixed = {
      ...rest,
      signals: rest.signals.map((s, i) =>
        i === 2 ? { ...s, sampleRateHz: 500, samples: doubled } : s,
      ),
    };
    const r = analyzeRecording(mixed, roi3, AUTO);
    expect(r.roiUsage.used).toEqual(['O1', 'O2']);
    expect(r.roiUsage.leftOut).toEqual([{ label: 'Oz', reason: 'sample-rate' }]);
    expect(r.warnings.join(' ')).toContain('Oz (sampled at 500 Hz, the region at 250 Hz)');
  });

  it('gives no PAF or CoG when no region channel remains, instead of using other channels', () => {
    // Cz holds the same 10.4 Hz peak: a fallback to all channels would report it.
    const noRoi = { ...rest, signals: rest.signals.filter((s) => s.label === 'Cz') };
    const czAsRegion = analyzeRecording(noRoi, settings({ roi: ['Cz'] }), AUTO);
    expect(Math.abs((czAsRegion.rest?.pafHz as number) - 10.4)).toBeLessThan(0.05);
    const r = analyzeRecording(noRoi, roi3, AUTO);
    expect(r.rest).toBeNull();
    expect(r.qc.alphaPeakProminenceDb).toBeNull();
    expect(r.roiUsage.status).toBe('none');
    expect(r.roiUsage.used).toEqual([]);
    const warning = r.warnings.find((w) => w.startsWith('No region-of-interest channel remains'));
    expect(warning).toBe(
      'No region-of-interest channel remains: O1 (not in the file); O2 (not in the file); ' +
        'Oz (not in the file). There is no region-of-interest result.',
    );
  });

  it('gives no PAF when no label is a 10-10 electrode', () => {
    const unnamed = {
      ...rest,
      signals: rest.signals.map((s, i) => ({ ...s, label: `EEG ${i + 1}` })),
    };
    const r = analyzeRecording(unnamed, roi3, AUTO);
    expect(r.rest).toBeNull();
    expect(r.roiUsage.status).toBe('none');
    expect(r.warnings).toContain(
      'No channel label is a 10-10 electrode: every signal is analysed.',
    );
  });
});

describe('analyzeRecording: a task recording whose region channels are all unusable', () => {
  it('has per-channel numbers but no region Δf, and says why', () => {
    const recording = syntheticTaskRecording({
      sampleRateHz: 250,
      durationS: 45,
      channelLabels: ['O1', 'O2', 'Cz'],
      onsetsS: Array.from({ length: 10 }, (_, i) => 3 + 4 * i),
      seed: 4,
    });
    const silent = {
      ...recording,
      signals: recording.signals.map((s) =>
        s.label === 'Cz' ? s : { ...s, samples: new Float32Array(s.samples.length) },
      ),
    };
    const r = analyzeRecording(silent, settings({ roi: ['O1', 'O2'] }), AUTO);
    expect(r.kind).toBe('task');
    expect(r.roi).toBeNull();
    expect(r.channels.every((c) => !c.inRoi)).toBe(true);
    expect(Math.abs((r.channels[2].deltaFHz as number) + 0.6)).toBeLessThan(0.05);
    expect(r.roiUsage).toEqual({
      wanted: ['O1', 'O2'],
      used: [],
      leftOut: [
        { label: 'O1', reason: 'flat' },
        { label: 'O2', reason: 'flat' },
      ],
      status: 'none',
    });
    expect(r.warnings).toContain(
      'No region-of-interest channel remains: O1 (flat); O2 (flat). ' +
        'There is no region-of-interest result.',
    );
  });
});
