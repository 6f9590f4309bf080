import {
  AnalyticWorkspace,
  analyticFftSize,
  analyticSignal,
  ComplexSeries,
} from './analytic-signal';
import { AmplitudeGateCount, gateByAmplitude, midpointEnvelope } from './amplitude-gate';
import { phaseDifferenceFrequency } from './instantaneous-frequency';
import { medianAcross } from './median-across';
import { RunningMedianWorkspace, runningMedianChunks } from './running-median';
import {
  DEFAULT_MORLET_CYCLES,
  DEFAULT_TRANSITION_FRACTION,
  morletWavelet,
  plateauBandPass,
  SpectralWeight,
} from './spectral-weights';
import type { NarrowBandMethodName } from '../pipeline/analysis-settings';

export interface MedianWindowOptions {
  sampleRateHz: number;
  /** Shortest window in ms (default 10, Cohen 2014). */
  shortestMs?: number;
  /** Longest window in ms (default 400, Cohen 2014). */
  longestMs?: number;
  /** Number of window lengths, evenly spaced (default 10, Cohen 2014). */
  count?: number;
}

/**
 * Median window lengths in samples: `count` lengths evenly spaced from `shortestMs`
 * to `longestMs` (Cohen 2014), each rounded to the nearest sample and made odd by
 * adding one when even, so that every window has a centre sample.
 */
export function medianWindowLengths(options: MedianWindowOptions): number[] {
  const shortest = options.shortestMs ?? 10;
  const longest = options.longestMs ?? 400;
  const count = options.count ?? 10;
  if (!(shortest > 0) || !(longest >= shortest)) {
    throw new RangeError(
      `median windows: expected 0 < shortestMs ≤ longestMs, got ${shortest} and ${longest} ms`,
    );
  }
  if (!Number.isInteger(count) || count < 1) {
    throw new RangeError(`median windows count: expected a positive integer, got ${count}`);
  }
  const lengths: number[] = [];
  for (let i = 0; i < count; i++) {
    const ms = count === 1 ? shortest : shortest + ((longest - shortest) * i) / (count - 1);
    let samples = Math.max(1, Math.round((ms * options.sampleRateHz) / 1000));
    if (samples % 2 === 0) samples += 1;
    lengths.push(samples);
  }
  return lengths;
}

export interface FrequencySlidingOptions {
  sampleRateHz: number;
  /**
   * Analysis band in Hz, already resolved: the analysis takes it from `resolveAnalysisBand`,
   * the one place a band is chosen.
   */
  bandHz: readonly [number, number];
  /** 'filter' (default): zero-phase plateau band-pass; 'morlet': complex Morlet wavelet. */
  method?: NarrowBandMethodName;
  /** Transition zones of the plateau filter as a fraction of the band edges (default 0.15). */
  transitionFraction?: number;
  /** Morlet cycles (default 7). */
  morletCycles?: number;
  /** Centre of the Morlet wavelet, Hz (default the band centre; the analysis gives the IAF when known). */
  morletCentreHz?: number;
  /** Median windows (default: 10 lengths from 10 to 400 ms). */
  medianWindows?: Omit<MedianWindowOptions, 'sampleRateHz'>;
  /** Mirrored samples at each end before the transform, in s (default: from the filter). */
  edgePaddingS?: number;
  /**
   * Values whose envelope is under this percentile of the channel's envelope become NaN
   * before the median and stay NaN after it (`amplitude-gate.ts`); null or absent = off.
   */
  amplitudeGatePercentile?: number | null;
}

/** The spectral weight (filter or wavelet) the options ask for. */
export function narrowBandWeight(options: FrequencySlidingOptions): SpectralWeight {
  const bandHz = options.bandHz;
  if ((options.method ?? 'filter') === 'morlet') {
    const centreHz = options.morletCentreHz ?? (bandHz[0] + bandHz[1]) / 2;
    return morletWavelet({ centreHz, cycles: options.morletCycles ?? DEFAULT_MORLET_CYCLES });
  }
  return plateauBandPass({ bandHz, transitionFraction: options.transitionFraction });
}

/**
 * Mirrored edge samples for the transform: at least 2 s, and at least four times the
 * inverse width of the lower transition zone, where the impulse response is longest
 * (common practice: pad by a few impulse-response lengths).
 */
export function defaultEdgePaddingS(options: FrequencySlidingOptions): number {
  const bandHz = options.bandHz;
  const t = options.transitionFraction ?? DEFAULT_TRANSITION_FRACTION;
  return Math.max(2, 4 / (bandHz[0] * t));
}

/** Buffers reused across the channels of one caller; never shared between concurrent calls. */
export class FrequencySlidingWorkspace {
  analytic: AnalyticWorkspace | null = null;
  private analyticOutput: ComplexSeries | null = null;
  readonly median = new RunningMedianWorkspace();
  private envelope = new Float64Array(0);
  private envelopeSorted = new Float64Array(0);

  analyticFor(size: number): AnalyticWorkspace {
    if (!this.analytic || this.analytic.size !== size) this.analytic = new AnalyticWorkspace(size);
    return this.analytic;
  }

  /**
   * The analytic signal's output for `n` samples: views of two buffers that only grow,
   * reused across channels (of any length).
   */
  analyticOutputFor(n: number): ComplexSeries {
    if (!this.analyticOutput || this.analyticOutput.re.length < n) {
      this.analyticOutput = { re: new Float64Array(n), im: new Float64Array(n) };
    }
    return { re: this.analyticOutput.re.subarray(0, n), im: this.analyticOutput.im.subarray(0, n) };
  }

  /** The amplitude gate's envelope and its sorted copy, `n` values each (gate on only). */
  envelopeFor(n: number): { envelope: Float64Array; sorted: Float64Array } {
    if (this.envelope.length < n) {
      this.envelope = new Float64Array(n);
      this.envelopeSorted = new Float64Array(n);
    }
    return { envelope: this.envelope.subarray(0, n), sorted: this.envelopeSorted };
  }
}

export interface FrequencySlidingResult {
  /** Median-filtered instantaneous frequency in Hz, N−1 values. */
  frequencyHz: Float64Array;
  /** Instantaneous frequency before median filtering, N−1 values. */
  rawFrequencyHz: Float64Array;
  /** Time of value 0 in s after the first sample: the midpoint 0.5/fs (Boashash 1992). */
  firstTimeS: number;
  sampleRateHz: number;
  bandHz: [number, number];
  medianWindowsSamples: number[];
  /** Share of raw values outside `bandHz` (phase slips, docs/method.md §6), before any gate. */
  outOfBandShare: number;
  /** What the amplitude gate left out (NaN in both series); null when the gate is off. */
  amplitudeGate: AmplitudeGateCount | null;
}

/**
 * "Frequency sliding" of one channel (docs/method.md §2): zero-phase narrow-band analytic
 * signal in one spectral multiplication (Marple 1999), phase-difference frequency
 * (Boashash 1992), then the median across running medians of 10 window lengths
 * (Cohen 2014, "Fluctuations in oscillation frequency control spike timing and
 * coordinate neural networks", J. Neurosci. 34:8988–8998).
 * Run it on the whole continuous recording, never on short epochs.
 */
export function frequencySliding(
  samples: Float32Array | Float64Array,
  options: FrequencySlidingOptions,
  workspace: FrequencySlidingWorkspace = new FrequencySlidingWorkspace(),
): FrequencySlidingResult {
  const n = Math.max(0, samples.length - 1);
  return slide(samples, options, workspace, new Float64Array(n), new Float64Array(n));
}

/**
 * `frequencySliding` with its two series in the workspace's buffers, overwritten by the next
 * call with the same workspace: the raw frequency takes the place of the analytic signal's
 * real part, the filtered frequency that of its imaginary part. A channel loop then touches
 * the same memory for every channel: fresh memory costs a page fault per 4 KiB on first
 * touch (about 50 ms for one 60-minute channel's 14 MB series on the benchmark machine).
 */
export function frequencySlidingInWorkspace(
  samples: Float32Array | Float64Array,
  options: FrequencySlidingOptions,
  workspace: FrequencySlidingWorkspace,
): FrequencySlidingResult {
  return slide(samples, options, workspace, null, null);
}

/** Null outputs: the analytic signal's own buffers (real part, then imaginary part). */
function slide(
  samples: Float32Array | Float64Array,
  options: FrequencySlidingOptions,
  workspace: FrequencySlidingWorkspace,
  rawOutput: Float64Array | null,
  filteredOutput: Float64Array | null,
): FrequencySlidingResult {
  const fs = options.sampleRateHz;
  const bandHz: [number, number] = [options.bandHz[0], options.bandHz[1]];
  const z = narrowBandAnalytic(samples, options, workspace);
  const n = Math.max(0, z.re.length - 1);
  const gatePercentile = options.amplitudeGatePercentile ?? null;
  // The envelope is read before the raw frequency overwrites the analytic signal.
  const gateBuffers = gatePercentile === null || n === 0 ? null : workspace.envelopeFor(n);
  if (gateBuffers) midpointEnvelope(z, gateBuffers.envelope);
  const raw = phaseDifferenceFrequency(z, { sampleRateHz: fs }, rawOutput ?? z.re.subarray(0, n));
  let outside = 0;
  for (let i = 0; i < raw.length; i++) if (raw[i] < bandHz[0] || raw[i] > bandHz[1]) outside++;
  let amplitudeGate: AmplitudeGateCount | null = null;
  if (gatePercentile !== null) {
    amplitudeGate = gateBuffers
      ? gateByAmplitude(raw, gateBuffers.envelope, gatePercentile, gateBuffers.sorted)
      : { percentile: gatePercentile, excludedSamples: 0, totalSamples: 0 };
  }
  const windows = medianWindowLengths({ sampleRateHz: fs, ...options.medianWindows });
  const frequencyHz = medianFilterFrequency(
    raw,
    windows,
    workspace,
    filteredOutput ?? z.im.subarray(0, n),
    amplitudeGate !== null,
  );
  return {
    frequencyHz,
    rawFrequencyHz: raw,
    firstTimeS: 0.5 / fs,
    sampleRateHz: fs,
    bandHz,
    medianWindowsSamples: windows,
    outOfBandShare: raw.length > 0 ? outside / raw.length : 0,
    amplitudeGate,
  };
}

/**
 * Step 1–2 of `frequencySliding`: the narrow-band analytic signal of one channel, in
 * the workspace's buffers (overwritten by the next call with the same workspace), so
 * that a channel loop allocates nothing per channel.
 */
export function narrowBandAnalytic(
  samples: Float32Array | Float64Array,
  options: FrequencySlidingOptions,
  workspace: FrequencySlidingWorkspace,
): ComplexSeries {
  const fs = options.sampleRateHz;
  const paddingS = options.edgePaddingS ?? defaultEdgePaddingS(options);
  const padding = Math.min(samples.length - 1, Math.ceil(paddingS * fs));
  const size = analyticFftSize(samples.length, padding, false);
  return analyticSignal(
    samples,
    { sampleRateHz: fs, weight: narrowBandWeight(options), edgePaddingSamples: padding },
    workspace.analyticFor(size),
    workspace.analyticOutputFor(samples.length),
  );
}

/**
 * Step 5 of `frequencySliding`: median across the running medians of `windowsSamples`,
 * chunk by chunk (exact: each chunk ranks its own samples plus the window margins),
 * so no full-length series per window is ever held. Writes into `output` when given.
 * `gated`: the running medians leave NaN (gated values) out, and a value that was NaN
 * stays NaN (its window always holds itself, so every other value has a median).
 */
export function medianFilterFrequency(
  raw: Float64Array,
  windowsSamples: readonly number[],
  workspace: FrequencySlidingWorkspace,
  output: Float64Array = new Float64Array(raw.length),
  gated = false,
): Float64Array {
  if (output.length !== raw.length) {
    throw new RangeError(`output: expected length ${raw.length}, got ${output.length}`);
  }
  // No window: medianAcross names the problem as before.
  if (windowsSamples.length === 0) return medianAcross([], output);
  runningMedianChunks(
    raw,
    { windowsSamples, skipNaN: gated },
    workspace.median,
    (start, medians) => {
      medianAcross(medians, output.subarray(start, start + medians[0].length));
    },
  );
  if (gated) for (let i = 0; i < raw.length; i++) if (Number.isNaN(raw[i])) output[i] = NaN;
  return output;
}
