/**
 * The numpy/scipy side of `npm run bench`: bench/scipy_pipeline.py run in a fresh Python
 * process, with Gyre's defaults read from Gyre's own code so both sides compute with the same
 * numbers, whatever those defaults become.
 */
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { defaultEdgePaddingS, medianWindowLengths } from '../signal/frequency/frequency-sliding';
import { MAX_STIMULUS_DURATION_S } from '../signal/onsets/stimulus-annotations';
import { DEFAULT_ANALYSIS_COMPUTATION } from '../signal/pipeline/analysis-computation';
import {
  BOOTSTRAP_RESAMPLES,
  BOOTSTRAP_SEED,
  DEFAULT_ANALYSIS_SETTINGS,
  resolveAnalysisBand,
} from '../signal/pipeline/analysis-settings';
import { DEFAULT_QUALITY_THRESHOLDS } from '../signal/quality/quality-checks';

/** The repository root, from backend/src/bench and backend/dist/bench alike. */
export const REPOSITORY_DIR = resolve(__dirname, '..', '..', '..');
export const SCIPY_SCRIPT = resolve(REPOSITORY_DIR, 'bench', 'scipy_pipeline.py');

/** What bench/scipy_pipeline.py reads from `--params`. */
export interface ScipyParameters {
  bandHz: [number, number];
  transitionFraction: number;
  edgePaddingS: number;
  medianWindows: number[];
  epochWindowS: [number, number];
  baselineWindowS: [number, number];
  postWindowS: [number, number];
  rejectionThresholdUv: number;
  flagThresholdHz: number;
  roi: string[];
  welchSegmentS: number;
  welchOverlapFraction: number;
  edgeGuardS: number;
  artefactPattern: string;
  maxStimulusDurationS: number;
  maxCurvePoints: number;
  bootstrapResamples: number;
  bootstrapSeed: number;
  alphaSearchHz: [number, number];
  flatBelowUv: number;
  saturationMinRunSamples: number;
  saturatedAboveShare: number;
}

/**
 * Gyre's analysis of a task recording at `rateHz` with a new study's settings (version 1) and
 * no resting IAF, as the benchmark's server computes it: the band is then 8–13 Hz.
 */
export function scipyParameters(rateHz: number): ScipyParameters {
  const settings = DEFAULT_ANALYSIS_SETTINGS;
  const computation = DEFAULT_ANALYSIS_COMPUTATION;
  const { bandHz } = resolveAnalysisBand(settings, null);
  return {
    bandHz,
    transitionFraction: computation.transitionFraction,
    edgePaddingS: defaultEdgePaddingS({
      sampleRateHz: rateHz,
      bandHz,
      transitionFraction: computation.transitionFraction,
    }),
    medianWindows: medianWindowLengths({ sampleRateHz: rateHz }),
    epochWindowS: [settings.epochWindowS[0], settings.epochWindowS[1]],
    baselineWindowS: [settings.baselineWindowS[0], settings.baselineWindowS[1]],
    postWindowS: [settings.postWindowS[0], settings.postWindowS[1]],
    rejectionThresholdUv: settings.rejectionThresholdUv,
    flagThresholdHz: settings.flagThresholdHz,
    roi: [...settings.roi],
    welchSegmentS: computation.welchSegmentS,
    welchOverlapFraction: computation.welchOverlapFraction,
    edgeGuardS: computation.edgeGuardS,
    artefactPattern: computation.artefactPattern,
    maxStimulusDurationS: MAX_STIMULUS_DURATION_S,
    maxCurvePoints: computation.maxCurvePoints,
    bootstrapResamples: BOOTSTRAP_RESAMPLES,
    bootstrapSeed: BOOTSTRAP_SEED,
    alphaSearchHz: [computation.alphaSearchHz[0], computation.alphaSearchHz[1]],
    flatBelowUv: DEFAULT_QUALITY_THRESHOLDS.flatBelowUv,
    saturationMinRunSamples: DEFAULT_QUALITY_THRESHOLDS.saturationMinRunSamples,
    saturatedAboveShare: DEFAULT_QUALITY_THRESHOLDS.saturatedAboveShare,
  };
}

/** Baseline, post and Δf over trials as both sides report them. */
export interface OnsetNumbers {
  deltaFHz: number | null;
  ciHz: [number, number] | null;
  pValue: number | null;
  trialsKept: number;
}

/** What bench/scipy_pipeline.py prints (the fields the benchmark reads). */
export interface ScipyRun {
  python: string;
  numpy: string;
  scipy: string;
  processes: 1 | 2;
  channels: number;
  onsets: number;
  wallS: number;
  cpuS: number;
  stepWallS: Record<string, number> | Record<'parent' | 'children', Record<string, number>>;
  stepCpuS: Record<string, number> | Record<'parent' | 'children', Record<string, number>>;
  peakRssMb: { processMb: number; childrenMb?: number[]; parentMb?: number };
  roi: OnsetNumbers & { channels: string[]; baselineHz: number | null; postHz: number | null };
  channelResults: (OnsetNumbers & { label: string; inRoi: boolean })[];
}

/** Runs the script on `edfPath` in a fresh Python process; throws with its stderr on failure. */
export function runScipyPipeline(edfPath: string, rateHz: number, processes: 1 | 2): ScipyRun {
  const child = spawnSync(
    'python3',
    [
      SCIPY_SCRIPT,
      edfPath,
      '--params',
      JSON.stringify(scipyParameters(rateHz)),
      '--processes',
      String(processes),
    ],
    { encoding: 'utf8', maxBuffer: 1 << 26 },
  );
  if (child.error) throw new Error(`python3 could not be started: ${child.error.message}`);
  if (child.status !== 0) {
    throw new Error(`bench/scipy_pipeline.py exited with ${child.status}:\n${child.stderr}`);
  }
  return JSON.parse(child.stdout) as ScipyRun;
}
