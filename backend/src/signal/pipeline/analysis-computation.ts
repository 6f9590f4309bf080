/**
 * Advanced computation knobs of the signal core: not study settings (an analyst never sets
 * them), but fixed choices of the method that tests, the benchmark and the command line may
 * vary. Their defaults live here and nowhere else.
 */
import { DEFAULT_TRANSITION_FRACTION } from '../frequency/spectral-weights';

export interface AnalysisComputationOptions {
  /** Transition zones of the band-pass as a fraction of the band edges (default 0.15). */
  transitionFraction?: number;
  /** Welch segment length, s (default 4: 0.25 Hz bins). */
  welchSegmentS?: number;
  /** Overlap of consecutive Welch segments, 0…1 (default 0.5, Welch 1967). */
  welchOverlapFraction?: number;
  /** Where the resting alpha peak is searched, Hz (default 7–13, docs/method.md §4). */
  alphaSearchHz?: readonly [number, number];
  /** Band of the centre of gravity, Hz (default: the search window). */
  cogBandHz?: readonly [number, number];
  /** Least height of the alpha peak over the 1/f background, dB (default 3). */
  minPeakProminenceDb?: number;
  /** Epochs closer than this to a recording edge or gap are dropped, s (default 1). */
  edgeGuardS?: number;
  /** Annotations matching this regular expression (case-insensitive) mark artefacts, not onsets. */
  artefactPattern?: string;
  /** Curve and raster points at most (default 500). */
  maxCurvePoints?: number;
}

/** Every knob with its value, as a result records it. */
export interface AnalysisComputation {
  transitionFraction: number;
  welchSegmentS: number;
  welchOverlapFraction: number;
  alphaSearchHz: [number, number];
  cogBandHz: [number, number];
  minPeakProminenceDb: number;
  edgeGuardS: number;
  artefactPattern: string;
  maxCurvePoints: number;
}

/** Default artefact annotations: any text containing "artefact" or "artifact". */
export const DEFAULT_ARTEFACT_PATTERN = 'artefact|artifact';

export const DEFAULT_ANALYSIS_COMPUTATION: Readonly<AnalysisComputation> = Object.freeze({
  transitionFraction: DEFAULT_TRANSITION_FRACTION,
  welchSegmentS: 4,
  welchOverlapFraction: 0.5,
  alphaSearchHz: [7, 13],
  cogBandHz: [7, 13],
  minPeakProminenceDb: 3,
  edgeGuardS: 1,
  artefactPattern: DEFAULT_ARTEFACT_PATTERN,
  maxCurvePoints: 500,
} satisfies AnalysisComputation);

/** The knobs with every default filled in (fresh arrays). */
export function resolveComputation(options: AnalysisComputationOptions = {}): AnalysisComputation {
  const d = DEFAULT_ANALYSIS_COMPUTATION;
  const search = options.alphaSearchHz ?? d.alphaSearchHz;
  // A narrower search window narrows the centre of gravity with it unless told otherwise.
  const cog = options.cogBandHz ?? options.alphaSearchHz ?? d.cogBandHz;
  return {
    transitionFraction: options.transitionFraction ?? d.transitionFraction,
    welchSegmentS: options.welchSegmentS ?? d.welchSegmentS,
    welchOverlapFraction: options.welchOverlapFraction ?? d.welchOverlapFraction,
    alphaSearchHz: [search[0], search[1]],
    cogBandHz: [cog[0], cog[1]],
    minPeakProminenceDb: options.minPeakProminenceDb ?? d.minPeakProminenceDb,
    edgeGuardS: options.edgeGuardS ?? d.edgeGuardS,
    artefactPattern: options.artefactPattern ?? d.artefactPattern,
    maxCurvePoints: options.maxCurvePoints ?? d.maxCurvePoints,
  };
}
