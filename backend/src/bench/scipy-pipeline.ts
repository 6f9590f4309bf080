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
  AnalysisSettings,
  BOOTSTRAP_RESAMPLES,
  BOOTSTRAP_SEED,
  copyAnalysisSettings,
  DEFAULT_ANALYSIS_SETTINGS,
  resolveAnalysisBand,
} from '../signal/pipeline/analysis-settings';
import {
  ChannelQualityThresholds,
  DEFAULT_QUALITY_THRESHOLDS,
} from '../signal/quality/quality-checks';

/** The repository root, from backend/src/bench and backend/dist/bench alike. */
export const REPOSITORY_DIR = resolve(__dirname, '..', '..', '..');
export const SCIPY_SCRIPT = resolve(REPOSITORY_DIR, 'bench', 'scipy_pipeline.py');

/** The study settings bench/scipy_pipeline.py computes with, as the server stores them. */
type ScipySettings = Pick<
  AnalysisSettings,
  | 'epochWindowS'
  | 'baselineWindowS'
  | 'postWindowS'
  | 'rejectionThresholdUv'
  | 'flagThresholdHz'
  | 'roi'
>;

/** What bench/scipy_pipeline.py reads from `--params`. */
export interface ScipyParameters extends ScipySettings, Required<ChannelQualityThresholds> {
  bandHz: [number, number];
  transitionFraction: number;
  edgePaddingS: number;
  medianWindows: number[];
  welchSegmentS: number;
  welchOverlapFraction: number;
  edgeGuardS: number;
  artefactPattern: string;
  maxStimulusDurationS: number;
  maxCurvePoints: number;
  bootstrapResamples: number;
  bootstrapSeed: number;
  alphaSearchHz: [number, number];
}

/**
 * Gyre's analysis of a task recording at `rateHz` with a new study's settings (version 1) and
 * no resting IAF, as the benchmark's server computes it: the band is then 8–13 Hz.
 */
export function scipyParameters(rateHz: number): ScipyParameters {
  const { epochWindowS, baselineWindowS, postWindowS, rejectionThresholdUv, flagThresholdHz, roi } =
    copyAnalysisSettings(DEFAULT_ANALYSIS_SETTINGS);
  const computation = DEFAULT_ANALYSIS_COMPUTATION;
  const { bandHz } = resolveAnalysisBand(DEFAULT_ANALYSIS_SETTINGS, null);
  return {
    bandHz,
    transitionFraction: computation.transitionFraction,
    edgePaddingS: defaultEdgePaddingS({
      sampleRateHz: rateHz,
      bandHz,
      transitionFraction: computation.transitionFraction,
    }),
    medianWindows: medianWindowLengths({ sampleRateHz: rateHz }),
    epochWindowS,
    baselineWindowS,
    postWindowS,
    rejectionThresholdUv,
    flagThresholdHz,
    roi,
    welchSegmentS: computation.welchSegmentS,
    welchOverlapFraction: computation.welchOverlapFraction,
    edgeGuardS: computation.edgeGuardS,
    artefactPattern: computation.artefactPattern,
    maxStimulusDurationS: MAX_STIMULUS_DURATION_S,
    maxCurvePoints: computation.maxCurvePoints,
    bootstrapResamples: BOOTSTRAP_RESAMPLES,
    bootstrapSeed: BOOTSTRAP_SEED,
    alphaSearchHz: [computation.alphaSearchHz[0], computation.alphaSearchHz[1]],
    ...DEFAULT_QUALITY_THRESHOLDS,
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
