import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  analyzeEdfRecording,
  readRecordingForAnalysis,
} from '../signal/pipeline/analyze-edf-recording';
import { DEFAULT_ANALYSIS_SETTINGS } from '../signal/pipeline/analysis-settings';
import type { AnalysisResult } from '../signal/pipeline/analysis.types';
import { benchRecordingBytes } from './bench-recording';
import { runScipyPipeline, ScipyRun } from './scipy-pipeline';

/**
 * The benchmark compares Gyre with bench/scipy_pipeline.py only if the script computes what
 * Gyre computes. Reference: numpy/scipy (scipy.signal.welch, scipy.fft, scipy.ndimage.
 * median_filter, scipy.stats.wilcoxon) run by that script on the same generated EDF+ file.
 * The bootstrap draws differ (numpy's generator, not Gyre's), so intervals are compared
 * only for their Monte Carlo agreement.
 */
describe('bench/scipy_pipeline.py computes Gyre’s task analysis', () => {
  let dir: string;
  let gyre: AnalysisResult;
  const runs: Record<1 | 2, ScipyRun> = {} as Record<1 | 2, ScipyRun>;

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'gyre-bench-spec-'));
    const path = join(dir, 'task.edf');
    // 1 minute, the 64 bench channels at 250 Hz: every ROI channel and 14 onsets (few enough
    // for the exact Wilcoxon distribution on both sides).
    writeFileSync(path, benchRecordingBytes({ minutes: 1, channels: 64, rateHz: 250 }));
    const read = await readRecordingForAnalysis(path);
    gyre = analyzeEdfRecording(read.finish(), {
      kind: 'task',
      settings: DEFAULT_ANALYSIS_SETTINGS,
      iafHz: null,
      onsets: null,
    }).result;
    runs[1] = runScipyPipeline(path, 250, 1);
    runs[2] = runScipyPipeline(path, 250, 2);
  }, 120_000);

  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it.each([1, 2] as const)('with %i process(es): the same trials, Δf and p per channel', (n) => {
    const scipy = runs[n];
    expect(scipy.channels).toBe(gyre.channels.length);
    scipy.channelResults.forEach((c, i) => {
      const g = gyre.channels[i];
      expect(c.label).toBe(g.label);
      expect(c.inRoi).toBe(g.inRoi);
      expect(c.trialsKept).toBe(g.trialsKept);
      // Same filter on a different FFT length (scipy's next_fast_len): equal to 1e-6 Hz.
      expect(Math.abs((c.deltaFHz ?? NaN) - (g.deltaFHz ?? NaN))).toBeLessThan(1e-6);
      expect(c.pValue).toBeCloseTo(g.pValue ?? NaN, 6);
    });
  });

  it.each([1, 2] as const)('with %i process(es): the region-of-interest numbers', (n) => {
    const roi = runs[n].roi;
    const g = gyre.roi;
    expect(g).not.toBeNull();
    expect(roi.channels).toEqual(g?.channels);
    expect(roi.trialsKept).toBe(g?.trialsKept);
    expect(Math.abs((roi.deltaFHz ?? NaN) - (g?.deltaFHz ?? NaN))).toBeLessThan(1e-6);
    expect(roi.pValue).toBeCloseTo(g?.pValue ?? NaN, 6);
    // Two bootstrap generators: bounds agree to a few per cent of the interval's width.
    const width = (g?.ciHz?.[1] ?? 0) - (g?.ciHz?.[0] ?? 0);
    expect(Math.abs((roi.ciHz?.[0] ?? NaN) - (g?.ciHz?.[0] ?? NaN))).toBeLessThan(0.1 * width);
    expect(Math.abs((roi.ciHz?.[1] ?? NaN) - (g?.ciHz?.[1] ?? NaN))).toBeLessThan(0.1 * width);
  });
});
