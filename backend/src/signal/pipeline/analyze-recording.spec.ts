import { syntheticRestRecording, syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import { analyzeRecording, AnalysisInputError } from './analyze-recording';

// Generated test data (see synthetic-eeg.ts): known answers by construction.
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
  const result = analyzeRecording(task, { onProgress: (f) => fractions.push(f) });

  it('recovers Δf within 0.03 Hz per channel and over the region of interest', () => {
    expect(result.kind).toBe('task');
    expect(result.channels.map((c) => c.label)).toEqual([
      'EEG O1-REF',
      'EEG O2-REF',
      'EEG Pz-REF',
      'EEG Fz-REF',
    ]);
    for (const c of result.channels) {
      expect(Math.abs((c.deltaHz as number) + 0.6)).toBeLessThan(0.03);
      expect(Math.abs((c.baselineHz as number) - 10)).toBeLessThan(0.03);
    }
    const roi = result.roi;
    expect(roi).not.toBeNull();
    expect(roi?.channels).toEqual(['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF']);
    expect(Math.abs((roi?.deltaHz as number) + 0.6)).toBeLessThan(0.03);
  });

  it('flags the slowing as suggested, with an interval below zero and a small p', () => {
    const roi = result.roi;
    expect(roi?.suggestedFlag).toBe(true);
    expect((roi?.ci95Hz as [number, number])[1]).toBeLessThan(0);
    expect(roi?.p as number).toBeLessThan(1e-6);
    expect(roi?.trialsKept).toBe(60);
    expect(roi?.trialsDropped).toBe(0);
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
    expect(result.qc.epochsDroppedShare).toBe(0);
    expect(result.qc.phaseSlipShare as number).toBeLessThan(0.05);
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
    const result = analyzeRecording({ ...recording, annotations }, { kind: 'task' });
    const [c1, c2] = result.channels;
    expect(c1.dropReasons).toEqual({ edge: 2, amplitude: 1, artefact: 1 });
    expect(c1.trialsKept).toBe(2);
    expect(c2.dropReasons).toEqual({ edge: 2, amplitude: 0, artefact: 1 });
    expect(c2.trialsKept).toBe(3);
    // The artefact annotation is not an onset.
    expect(result.settings.onsetCount).toBe(6);
  });

  it('says so when a task analysis finds no onsets of the chosen label', () => {
    const recording = syntheticTaskRecording({
      sampleRateHz: 250,
      durationS: 20,
      channelLabels: ['O1'],
      onsetsS: [5, 10],
    });
    expect(() => analyzeRecording(recording, { onsetLabel: 'target', kind: 'task' })).toThrow(
      AnalysisInputError,
    );
    expect(() => analyzeRecording(recording, { onsetLabel: 'target', kind: 'task' })).toThrow(
      /found none labelled "target" in the annotations/,
    );
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
  const result = analyzeRecording(rest);

  it('finds PAF within 0.05 Hz and a CoG in the alpha band', () => {
    expect(result.kind).toBe('rest');
    expect(result.channels).toEqual([]);
    expect(result.rest).not.toBeNull();
    expect(Math.abs((result.rest?.pafHz as number) - 10.4)).toBeLessThan(0.05);
    expect(result.rest?.cogHz as number).toBeGreaterThan(9.5);
    expect(result.rest?.cogHz as number).toBeLessThan(11);
    expect(result.rest?.channels).toEqual(['O1', 'O2', 'Oz']);
    expect(result.qc.alphaPeakProminenceDb as number).toBeGreaterThan(3);
  });

  it('finds a flat channel and leaves it out of the region of interest', () => {
    const flat = {
      ...rest,
      signals: rest.signals.map((s, i) =>
        i === 1 ? { ...s, samples: new Float32Array(s.samples.length) } : s,
      ),
    };
    const r = analyzeRecording(flat);
    expect(r.qc.flatChannels).toEqual(['O2']);
    expect(r.rest?.channels).toEqual(['O1', 'Oz']);
    expect(r.warnings.some((w) => w.includes('O2'))).toBe(true);
  });
});
