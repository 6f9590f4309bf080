import { readEdf } from '../edf/edf-reader';
import { writeEdf } from '../edf/edf-writer';
import type { EdfRecording } from '../edf/edf.types';
import { syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import { DEFAULT_ANALYSIS_SETTINGS } from './analysis-settings';
import type { AnalysisResult } from './analysis.types';
import { analyzeRecording } from './analyze-recording';

// Generated test data, written to EDF+ and read back (Kemp et al. 1992; Kemp & Olivan 2003).
// Each channel is a sinusoid whose frequency is 10 Hz, and 9.4 Hz from +0.2 to +0.8 s after
// each onset (raised-cosine ramps outside), plus white noise of 0.002 µV: by construction
// Δf = −0.6 Hz exactly between the default baseline (−0.5…0 s) and post (+0.2…+0.8 s) windows.
// The noise is tiny so that the rhythm's crests come back to its peak again and again: the
// case where a file's range written at its peak looked clipped.
const ROI = ['O1', 'O2', 'Oz', 'Pz'];
const SAMPLE_RATE_HZ = 250;
const onsetsS = Array.from({ length: 20 }, (_, i) => 3 + 4 * i);
const generated = syntheticTaskRecording({
  sampleRateHz: SAMPLE_RATE_HZ,
  durationS: 85,
  channelLabels: ROI,
  onsetsS,
  noiseUv: 0.002,
  seed: 5,
});
/** Every channel scaled so its largest magnitude is exactly 25 µV. */
const PEAK_UV = 25;
const scaled = generated.signals.map((s) => {
  let peak = 0;
  let at = 0;
  s.samples.forEach((v, i) => {
    if (Math.abs(v) > peak) [peak, at] = [Math.abs(v), i];
  });
  const samples = Float32Array.from(s.samples, (v) => (v * PEAK_UV) / peak);
  samples[at] = Math.sign(s.samples[at]) * PEAK_UV;
  return { label: s.label, samples };
});

function writeAndRead(
  signals: readonly { label: string; samples: Float32Array }[],
  rangeUv: number,
): EdfRecording {
  const bytes = writeEdf({
    format: 'EDF+C',
    startDate: '2024-03-01T10:00:00',
    signals: signals.map((s) => ({
      label: s.label,
      sampleRateHz: SAMPLE_RATE_HZ,
      physicalMin: -rangeUv,
      physicalMax: rangeUv,
      samples: s.samples,
    })),
    annotations: onsetsS.map((onsetS) => ({ onsetS, durationS: null, text: 'stimulus' })),
  });
  return readEdf(bytes);
}

const analyse = (recording: EdfRecording): AnalysisResult =>
  analyzeRecording(
    recording,
    { ...DEFAULT_ANALYSIS_SETTINGS, roi: ROI },
    { kind: 'task', iafHz: null },
  );

/** Samples whose digital value is the rail: EDF digital = round((x − pmin)·(dmax − dmin)/(pmax − pmin) + dmin). */
function atDigitalRail(recording: EdfRecording, index: number): number {
  const s = recording.signals[index];
  const q = (s.physicalMax - s.physicalMin) / (s.digitalMax - s.digitalMin);
  return s.samples.filter((v) => Math.abs(Math.abs(v) - s.physicalMax) <= q / 2).length;
}

describe('saturation: a clean rhythm whose range is written at or just above its peak', () => {
  it('is the case the former rule (within 0.1 % of the range, over 1 %) called clipped', () => {
    const rangeUv = PEAK_UV * 1.0001;
    const nearLimitShare = scaled.map(
      (s) =>
        s.samples.filter((v) => Math.abs(v) >= rangeUv - 2 * rangeUv * 1e-3).length /
        s.samples.length,
    );
    expect(nearLimitShare.some((share) => share > 0.01)).toBe(true);
  });

  it.each([
    ['0.01 % above its peak', PEAK_UV * 1.0001, 0],
    ['exactly at its peak', PEAK_UV, 1],
  ])(
    'with the physical range %s: no channel saturated, region complete, Δf = −0.6 Hz',
    (_name, rangeUv, railSamplesAtLeast) => {
      const recording = writeAndRead(scaled, rangeUv);
      // The header says what was written, and the crest meets the rail as intended.
      expect(recording.signals[0].physicalMax).toBeCloseTo(rangeUv, 5);
      for (let c = 0; c < ROI.length; c++) {
        const rail = atDigitalRail(recording, c);
        if (railSamplesAtLeast === 0) expect(rail).toBe(0);
        else expect(rail).toBeGreaterThanOrEqual(railSamplesAtLeast);
      }
      const result = analyse(recording);
      expect(result.qc.saturatedChannels).toEqual([]);
      for (const q of result.qc.channels) {
        expect(q.saturated).toBe(false);
        expect(q.saturatedShare).toBe(0);
      }
      expect(result.roiUsage).toEqual({ wanted: ROI, used: ROI, leftOut: [], status: 'complete' });
      expect(result.roi?.trialsKept).toBe(20);
      // Closed-form truth of the generated signal: Δf = −0.6 Hz.
      expect(Math.abs((result.roi?.deltaFHz as number) + 0.6)).toBeLessThan(0.03);
      for (const c of result.channels) {
        expect(c.inRoi).toBe(true);
        expect(Math.abs((c.deltaFHz as number) + 0.6)).toBeLessThan(0.03);
      }
    },
  );
});

describe('saturation: a channel held at the rail for a few % of its samples', () => {
  // Three 1 s, 300 µV half-sine swings on O2 (like electrode movement) drive it past the
  // ±25.0025 µV range: the EDF writer clips them to the rail, as an amplifier saturates.
  const rangeUv = PEAK_UV * 1.0001;
  const swingsS = [20, 40, 60];
  const o2 = scaled[1].samples.slice();
  for (const startS of swingsS) {
    const first = startS * SAMPLE_RATE_HZ;
    for (let i = 0; i < SAMPLE_RATE_HZ; i++) {
      o2[first + i] += 300 * Math.sin((Math.PI * i) / SAMPLE_RATE_HZ);
    }
  }
  // Share clipped by construction: samples beyond the range before writing.
  const clippedShare = o2.filter((v) => Math.abs(v) > rangeUv).length / o2.length;
  const recording = writeAndRead(
    scaled.map((s, c) => (c === 1 ? { label: s.label, samples: o2 } : s)),
    rangeUv,
  );
  const result = analyse(recording);

  it('is saturated, with the share of its samples held at the rail', () => {
    expect(clippedShare).toBeGreaterThan(0.02);
    expect(clippedShare).toBeLessThan(0.05);
    expect(result.qc.saturatedChannels).toEqual(['O2']);
    const share = result.qc.channels[1].saturatedShare as number;
    // Runs shorter than 5 samples where a swing starts or ends are not counted.
    expect(Math.abs(share - clippedShare)).toBeLessThan(0.002);
  });

  it('is left out of the region with the reason "saturated", the others still give Δf', () => {
    expect(result.roiUsage).toEqual({
      wanted: ROI,
      used: ['O1', 'Oz', 'Pz'],
      leftOut: [{ label: 'O2', reason: 'saturated' }],
      status: 'partial',
    });
    expect(result.roi?.channels).toEqual(['O1', 'Oz', 'Pz']);
    expect(result.channels.map((c) => c.inRoi)).toEqual([true, false, true, true]);
    expect(result.warnings.join(' ')).toContain('O2 (saturated');
    expect(Math.abs((result.roi?.deltaFHz as number) + 0.6)).toBeLessThan(0.03);
  });
});
