/**
 * Why an epoch is left out. 'amplitudeGate': with the amplitude gate on, its baseline or
 * post window kept no frequency value (docs/method.md, "Amplitude gate").
 */
export type EpochDropReason = 'edge' | 'amplitude' | 'artefact' | 'amplitudeGate';

/** A span of the recording marked as artefact, in s from the recording start. */
export interface ArtefactSpan {
  startS: number;
  endS: number;
}

/** A stretch of recording without gaps, s from the recording start. */
export interface DataSegmentS {
  startS: number;
  endS: number;
}

export interface TrialScreenOptions {
  recordingDurationS: number;
  /** Gap-free stretches (EDF+D); default one stretch from 0 to the duration. */
  segmentsS?: readonly DataSegmentS[];
  /** Epoch around each onset, s (`AnalysisSettings.epochWindowS`). */
  epochWindowS: readonly [number, number];
  /** Epochs starting or ending closer than this to a recording edge are dropped (default 1 s). */
  edgeGuardS?: number;
  artefacts?: readonly ArtefactSpan[];
}

/**
 * Reasons that drop a trial on every channel (docs/method.md §3): the epoch starts or ends
 * within `edgeGuardS` of the recording's edges (the transform's edge artefacts live
 * there; a gap of EDF+D counts as an edge too), or it overlaps an artefact span. Null
 * keeps the trial.
 */
export function screenTrials(
  onsetsS: readonly number[],
  options: TrialScreenOptions,
): (EpochDropReason | null)[] {
  const guard = options.edgeGuardS ?? 1;
  const [e0, e1] = options.epochWindowS;
  const artefacts = options.artefacts ?? [];
  const segments = options.segmentsS ?? [{ startS: 0, endS: options.recordingDurationS }];
  return onsetsS.map((t) => {
    const start = t + e0;
    const end = t + e1;
    const inside = segments.some((g) => start >= g.startS + guard && end <= g.endS - guard);
    if (!inside) return 'edge';
    if (artefacts.some((a) => a.startS <= end && a.endS >= start)) return 'artefact';
    return null;
  });
}

/**
 * Whether the raw epoch exceeds ±`limit` (same unit as the samples) after its mean is
 * removed (common practice: ±100 µV; docs/method.md §3).
 */
export function epochExceedsAmplitude(
  samples: Float32Array | Float64Array,
  options: {
    sampleRateHz: number;
    onsetS: number;
    epochWindowS: readonly [number, number];
    limit: number;
  },
): boolean {
  const fs = options.sampleRateHz;
  const first = Math.max(0, Math.round((options.onsetS + options.epochWindowS[0]) * fs));
  const last = Math.min(
    samples.length - 1,
    Math.round((options.onsetS + options.epochWindowS[1]) * fs),
  );
  if (last < first) return false;
  let mean = 0;
  for (let i = first; i <= last; i++) mean += samples[i];
  mean /= last - first + 1;
  for (let i = first; i <= last; i++) {
    if (Math.abs(samples[i] - mean) > options.limit) return true;
  }
  return false;
}

/** Index range [start, end) of epoch points whose time lies in [fromS, toS). */
export function epochPointRange(
  epochWindowS: readonly [number, number],
  sampleRateHz: number,
  windowS: readonly [number, number],
): [number, number] {
  // A small tolerance keeps points that sit exactly on a window edge on the right side.
  const start = Math.ceil((windowS[0] - epochWindowS[0]) * sampleRateHz - 1e-9);
  const end = Math.ceil((windowS[1] - epochWindowS[0]) * sampleRateHz - 1e-9);
  return [Math.max(0, start), end];
}

/** Number of points of an epoch: one per frequency value from its start to its end. */
export function epochPointCount(
  epochWindowS: readonly [number, number],
  sampleRateHz: number,
): number {
  return Math.floor((epochWindowS[1] - epochWindowS[0]) * sampleRateHz + 1e-9) + 1;
}

/**
 * Frequency epochs cut from a continuous frequency series (trials × points, row-major).
 * Value j of the series belongs to time firstTimeS + j/fs (a sample midpoint); point i of
 * an epoch to onset + epochWindowS[0] + i/fs, taken from the nearest value. Points that fall
 * outside the series are NaN (screenTrials drops such epochs anyway). Writes into `output`
 * (length trials × points) when given, e.g. a buffer reused from channel to channel.
 */
export function cutFrequencyEpochs(
  frequencyHz: Float64Array,
  options: {
    sampleRateHz: number;
    firstTimeS: number;
    onsetsS: readonly number[];
    epochWindowS: readonly [number, number];
  },
  output?: Float64Array,
): Float64Array {
  const fs = options.sampleRateHz;
  const points = epochPointCount(options.epochWindowS, fs);
  const trials = options.onsetsS.length;
  const out = output ?? new Float64Array(trials * points);
  if (out.length !== trials * points) {
    throw new RangeError(`output: expected length ${trials * points}, got ${out.length}`);
  }
  const n = frequencyHz.length;
  for (let trial = 0; trial < trials; trial++) {
    const t = options.onsetsS[trial];
    const j0 = Math.round((t + options.epochWindowS[0] - options.firstTimeS) * fs);
    const row = trial * points;
    if (!Number.isFinite(j0)) {
      out.fill(NaN, row, row + points);
      continue;
    }
    // Points [from, to) of the epoch lie inside the series; the others are NaN.
    const from = Math.min(points, Math.max(0, -j0));
    const to = Math.max(from, Math.min(points, n - j0));
    out.fill(NaN, row, row + from);
    out.set(frequencyHz.subarray(j0 + from, j0 + to), row + from);
    out.fill(NaN, row + to, row + points);
  }
  return out;
}
