import { frequencyTrack } from '@gyre/backend/signal';
import { DEMO_MONTAGE } from './montage';
import {
  generateRestingRecording,
  generateTaskRecording,
  STIMULUS_LABEL,
} from './recording-generator';
import { scipyReference, ScratchFolder } from './testing/scipy-reference';

// Every recording here is generated data; the references are numpy/scipy measurements
// (scipy_reference.py) and the EDF/EDF+ specifications (Kemp et al. 1992; Kemp & Olivan 2003).

/** Gyre's default posterior region of interest (docs/method.md §1). */
const ROI = ['O1', 'O2', 'Oz', 'POz', 'PO3', 'PO4', 'PO7', 'PO8', 'Pz', 'P3', 'P4'];

interface EdfSummary {
  version: string;
  patient: string;
  start_date: string;
  start_time: string;
  reserved: string;
  record_count: number;
  record_s: number;
  sample_rate_hz: number;
  labels: string[];
  max_abs_uv: Record<string, number>;
  annotations: Array<{ onset_s: number; duration_s: number | null; text: string }>;
}

interface Spectra {
  roi_paf_hz: number;
  low_over_high_power: number;
  channels: Record<string, { peak_hz: number; alpha_power: number; line_ratio: number }>;
}

const scratch = new ScratchFolder();
afterAll(() => scratch.dispose());

describe('generateRestingRecording (generated data)', () => {
  const iafHz = 9.74;
  const rest = generateRestingRecording({
    seedKey: 'spec/rest',
    startDate: '2024-05-06T09:15:00',
    patientId: 'LAF-X001 X X X',
    durationS: 150,
    iafHz,
    alphaAmplitudeUv: 28,
  });
  const file = scratch.write('rest.edf', rest.edf);
  let spectraOnce: Spectra | null = null;
  const spectra = (): Spectra =>
    (spectraOnce ??= scipyReference<Spectra>({ op: 'spectra', edf: file, roi: ROI }));

  it('is a valid EDF+C file of 25 10-10 channels at 250 Hz with the whole posterior set (Kemp & Olivan 2003; ACNS 2016)', () => {
    const summary = scipyReference<EdfSummary>({ op: 'edf_summary', edf: file });
    expect(summary.version).toBe('0');
    expect(summary.reserved).toBe('EDF+C');
    expect(summary.patient).toBe('LAF-X001 X X X');
    expect(summary.start_date).toBe('06.05.24');
    expect(summary.start_time).toBe('09.15.00');
    expect(summary.record_count).toBe(150);
    expect(summary.record_s).toBe(1);
    expect(summary.sample_rate_hz).toBe(250);
    expect(summary.labels).toHaveLength(25);
    const electrodes = summary.labels.map((l) => /^EEG (\w+)-REF$/.exec(l)?.[1]);
    for (const name of ROI) expect(electrodes).toContain(name);
    // Nothing reaches the ±800 µV range written in the header, so nothing was clipped.
    expect(Math.max(...Object.values(summary.max_abs_uv))).toBeLessThan(400);
    expect(summary.annotations).toEqual([{ onset_s: 0, duration_s: 150, text: 'Eyes closed' }]);
  });

  it('peaks at the generated IAF in the region of interest (scipy.signal.welch, 4 s Hann, parabolic peak)', () => {
    expect(Math.abs(spectra().roi_paf_hz - iafHz)).toBeLessThan(0.05);
  });

  it('has per-channel alpha frequency and amplitude, 1/f background, 50 Hz line noise (scipy.signal.welch)', () => {
    const { channels, low_over_high_power } = spectra();
    for (const channel of DEMO_MONTAGE) {
      const measured = channels[channel.electrode];
      // Each electrode's alpha runs at IAF + its offset (0.25 Hz Welch bins, parabolic refinement).
      expect(Math.abs(measured.peak_hz - (iafHz + channel.alphaOffsetHz))).toBeLessThan(0.12);
      // Mains at 50 Hz stands well above its spectral neighbours.
      expect(measured.line_ratio).toBeGreaterThan(10);
    }
    // Occipital alpha is designed 1/0.12 times larger in amplitude than at Fp1: ~70× in power.
    expect(channels.O1.alpha_power / channels.Fp1.alpha_power).toBeGreaterThan(30);
    // A 1/f background has far more power at 2–5 Hz than at 20–40 Hz (about 9× for 1/f).
    expect(low_over_high_power).toBeGreaterThan(4);
  });

  it('has eye-blink deflections at the front and not at the back', () => {
    const summary = scipyReference<EdfSummary>({ op: 'edf_summary', edf: file });
    expect(summary.max_abs_uv['EEG Fp1-REF']).toBeGreaterThan(80);
    expect(summary.max_abs_uv['EEG Fp1-REF']).toBeGreaterThan(2 * summary.max_abs_uv['EEG Cz-REF']);
  });

  it('is deterministic: the same options give the same bytes, another seed other bytes', () => {
    const options = {
      seedKey: 'spec/determinism',
      startDate: '2024-05-06T09:15:00',
      durationS: 20,
      iafHz: 10,
      alphaAmplitudeUv: 25,
    };
    const a = generateRestingRecording(options).edf;
    const b = generateRestingRecording(options).edf;
    const c = generateRestingRecording({ ...options, seedKey: 'spec/determinism-2' }).edf;
    expect(Buffer.from(b).equals(Buffer.from(a))).toBe(true);
    expect(Buffer.from(c).equals(Buffer.from(a))).toBe(false);
  });
});

describe('generateTaskRecording (generated data)', () => {
  const iafHz = 10.12;
  const deltaFHz = -0.6;
  /** 48 trials at `iafHz`, slowing by `deltaFHz`, 20 µV alpha; `changes` on top. */
  const taskRecording = (
    seedKey: string,
    changes: Partial<Parameters<typeof generateTaskRecording>[0]> = {},
  ) =>
    generateTaskRecording({
      seedKey,
      startDate: '2024-05-06T09:30:00',
      trialCount: 48,
      iafHz,
      deltaFHz,
      alphaAmplitudeUv: 20,
      ...changes,
    });
  const task = taskRecording('spec/task');
  const file = scratch.write('task.edf', task.edf);
  /** The largest |Fp1| (µV) in each window of the task recording, as numpy reads it. */
  const fp1MaxUv = (windows: number[][]) =>
    scipyReference<{ max_abs_uv: number[] }>({
      op: 'window_max',
      edf: file,
      channel: 'Fp1',
      windows_s: windows,
    }).max_abs_uv;
  /** Mean Δf after `onsetsS` over the ROI: scipy band-pass, Hilbert, median filters. */
  const scipyDeltaFHz = (edf: string, onsetsS: number[]) =>
    scipyReference<{ mean_delta_f_hz: number }>({
      op: 'onset_delta_f',
      edf,
      roi: ROI,
      onsets_s: onsetsS,
      band: [iafHz - 2, iafHz + 2],
    }).mean_delta_f_hz;

  it('writes every onset as an EDF+ annotation and in the CSV, inside the recording (Kemp & Olivan 2003 TALs)', () => {
    const summary = scipyReference<EdfSummary>({ op: 'edf_summary', edf: file });
    expect(summary.record_count).toBe(task.durationS);
    expect(summary.annotations).toHaveLength(48);
    expect(summary.annotations.every((a) => a.text === STIMULUS_LABEL)).toBe(true);
    expect(summary.annotations.map((a) => a.onset_s)).toEqual(task.onsetsS);
    const csvRows = (task.onsetCsv ?? '').trim().split('\n');
    expect(csvRows[0]).toBe('onset_s,label');
    expect(csvRows.slice(1).map((row) => Number(row.split(',')[0]))).toEqual(task.onsetsS);
    expect(task.onsetsS[0]).toBeGreaterThanOrEqual(5);
    expect(task.onsetsS[47]).toBeLessThanOrEqual(task.durationS - 5);
    for (let k = 1; k < 48; k++) {
      const gap = task.onsetsS[k] - task.onsetsS[k - 1];
      expect(gap).toBeGreaterThanOrEqual(3.6 - 0.004);
      expect(gap).toBeLessThanOrEqual(4.6 + 0.004);
    }
  });

  it('labels the onsets with the given conditions in turn, in the annotations and the CSV', () => {
    const labelled = taskRecording('spec/task-labels', {
      trialCount: 5,
      onsetLabels: ['Tone', 'Word'],
    });
    const expected = ['Tone', 'Word', 'Tone', 'Word', 'Tone'];
    // Read back by the Python EDF+ reader of scipy_reference.py, not by Gyre's reader.
    const summary = scipyReference<EdfSummary>({
      op: 'edf_summary',
      edf: scratch.write('task-labels.edf', labelled.edf),
    });
    expect(summary.annotations.map((a) => a.text)).toEqual(expected);
    const csvRows = (labelled.onsetCsv ?? '').trim().split('\n').slice(1);
    expect(csvRows.map((row) => row.split(',')[1])).toEqual(expected);
  });

  it('keeps blinks between trials: Fp1 stays quiet inside every −1…+2 s epoch and blinks outside', () => {
    const epochs = task.onsetsS.map((t) => [t - 1, t + 2]);
    const gaps = task.onsetsS.slice(1).map((t, k) => [task.onsetsS[k] + 2, t - 1]);
    const inside = fp1MaxUv(epochs);
    const between = fp1MaxUv(gaps);
    // Background and frontal alpha alone stay far below Gyre's ±100 µV rejection (docs/method.md §3).
    expect(Math.max(...inside)).toBeLessThan(50);
    expect(between.filter((v) => v > 60).length).toBeGreaterThan(5);
  });

  it('slows by the generated Δf after onset: scipy band-pass, Hilbert, median filters give it within 0.05 Hz', () => {
    expect(Math.abs(scipyDeltaFHz(file, task.onsetsS) - deltaFHz)).toBeLessThan(0.05);
  });

  it('has no onset change when Δf is 0 (the same measurement within 0.03 Hz of zero)', () => {
    const stable = taskRecording('spec/task-stable', { deltaFHz: 0 });
    const edf = scratch.write('task-stable.edf', stable.edf);
    expect(Math.abs(scipyDeltaFHz(edf, stable.onsetsS))).toBeLessThan(0.03);
  });

  it('follows the designed instantaneous frequency when noise is off (scipy.signal.hilbert vs closed form)', () => {
    const clean = taskRecording('spec/task-clean', {
      trialCount: 20,
      deltaFHz: -0.8,
      // Large, so 16-bit quantisation (0.024 µV steps) adds little phase noise: raw IF multiplies it by fs/2π.
      alphaAmplitudeUv: 200,
      backgroundRmsUv: 0,
      lineNoiseUv: 0,
      blinksPerMinute: 0,
      frequencyWanderHz: 0,
      alphaEnvelopeDepth: 0,
    });
    // Oz has no frequency offset in the montage: its track is IAF + Δf·dipWeight(t − onset).
    const design = frequencyTrack({
      sampleRateHz: 250,
      sampleCount: clean.durationS * 250,
      baseHz: iafHz,
      onsetsS: clean.onsetsS,
      deltaFHz: -0.8,
    });
    const result = scipyReference<{ max_abs_error_hz: number; rms_error_hz: number }>({
      op: 'hilbert_track',
      edf: scratch.write('task-clean.edf', clean.edf),
      design: scratch.write('design.f64', design),
      channel: 'Oz',
      // The FFT-based transform wraps the ends together; its error fades over several seconds.
      edge_s: 10,
    });
    // What remains is 16-bit quantisation noise, about 0.002 Hz RMS at this amplitude.
    expect(result.rms_error_hz).toBeLessThan(0.006);
    expect(result.max_abs_error_hz).toBeLessThan(0.03);
  });

  it('refuses onset intervals shorter than an epoch, naming the field', () => {
    expect(() => taskRecording('spec/bad', { trialCount: 5, interOnsetIntervalS: [2, 3] })).toThrow(
      /interOnsetIntervalS: 2 s found, at least 3 s expected/,
    );
  });
});
