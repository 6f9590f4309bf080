import { fftPlan, FftPlan, isPowerOfTwo, nextPowerOfTwo } from './fft-plan';

/**
 * DFT bins of one contiguous band of an M-point transform, and the way back, by
 * decimation: with M = D·L (L a power of two) and t = D·u + v,
 *   X[k] = Σ_v W_M^(k·v) · X_v[k mod L],   X_v = L-point DFT of x[D·u + v]   (forward),
 *   y[D·u + v] = Σ_j Y_v[j] · W_L^(−j·u),  Y_v[j] = Σ_(k ≡ j mod L) Z[k] · W_M^(−k·v)   (inverse),
 * where W_N = e^(−2πi/N). Both are the Cooley–Tukey factorisation (common practice)
 * pruned to the band: only the D short transforms are computed in full, so the work is
 * about M·log2 L instead of M·log2 M, and each short transform stays in cache.
 * The same algebra, not an approximation: results equal the full DFT up to rounding.
 */
/**
 * Phases handed to or taken from the caller at a time: for t = D·u + v, eight
 * neighbouring phases at one u are eight neighbouring samples, one cache line of
 * doubles, so the caller reads and writes its series in whole lines, not at stride D.
 */
const PHASE_GROUP = 8;

/**
 * Objects, not closures, so that the optimised loop keeps one call target from call to
 * call (a fresh closure per call makes V8 discard the optimised code each time).
 */
export interface PhaseSource {
  /** Writes x[D·u + firstPhase + j] into out[j][u] for every u < L. */
  readPhases(firstPhase: number, out: readonly Float64Array[]): void;
}

export interface PhaseSink {
  /** Receives y[j][2u], y[j][2u + 1] = conj(M·z[D·u + firstPhase + j]) for every u < L. */
  takePhases(firstPhase: number, y: readonly Float64Array[]): void;
}

export class BandDftPlan {
  readonly size: number;
  readonly subSize: number;
  readonly decimation: number;
  private readonly sub: FftPlan;

  constructor(size: number, subSize: number) {
    if (!isPowerOfTwo(subSize) || !Number.isInteger(size / subSize) || size < subSize) {
      throw new RangeError(
        `band DFT: expected size = D·subSize with subSize a power of two, got ${size} and ${subSize}`,
      );
    }
    this.size = size;
    this.subSize = subSize;
    this.decimation = size / subSize;
    this.sub = fftPlan(subSize);
  }

  /**
   * Bins `firstBin` … `lastBin` (0 ≤ first ≤ last < M) of the forward DFT of a real
   * input, written interleaved into `band` (length 2·(last − first + 1)).
   * `input.readPhases(v, out)` writes x[D·u + v + j] into `out[j]` for u < L: the
   * caller decides how the input is stored (e.g. mirrored at its edges) without a copy
   * of M values.
   */
  forwardRealBand(
    input: PhaseSource,
    firstBin: number,
    lastBin: number,
    band: Float64Array,
    scratch: BandDftScratch,
  ): void {
    const count = this.checkBand(firstBin, lastBin, band, scratch);
    const l = this.subSize;
    const { phaseSpectrum, rotation } = scratch;
    const root = scratch.rootsFor(this.size, firstBin, count);
    band.fill(0, 0, 2 * count);
    // rotation[k] = W_M^(k·v), advanced by one factor W_M^k per phase.
    for (let i = 0; i < count; i++) {
      rotation[2 * i] = 1;
      rotation[2 * i + 1] = 0;
    }
    const half = l / 2;
    const firstJ = firstBin % l;
    for (let v = 0; v < this.decimation; v++) {
      const slot = v % PHASE_GROUP;
      if (slot === 0) {
        input.readPhases(
          v,
          scratch.phaseInputs.slice(0, Math.min(PHASE_GROUP, this.decimation - v)),
        );
      }
      this.sub.forwardReal(scratch.phaseInputs[slot], phaseSpectrum);
      for (let i = 0, j = firstJ; i < count; i++) {
        // Bins above L/2 of a real input's DFT: X_v[j] = conj X_v[L − j].
        let xr: number;
        let xi: number;
        if (j <= half) {
          xr = phaseSpectrum[2 * j];
          xi = phaseSpectrum[2 * j + 1];
        } else {
          xr = phaseSpectrum[2 * (l - j)];
          xi = -phaseSpectrum[2 * (l - j) + 1];
        }
        const pr = rotation[2 * i];
        const pi = rotation[2 * i + 1];
        band[2 * i] += pr * xr - pi * xi;
        band[2 * i + 1] += pr * xi + pi * xr;
        const rr = root[2 * i];
        const ri = root[2 * i + 1];
        rotation[2 * i] = pr * rr - pi * ri;
        rotation[2 * i + 1] = pr * ri + pi * rr;
        j = j + 1 === l ? 0 : j + 1;
      }
    }
  }

  /**
   * Inverse of a spectrum that is zero outside bins `firstBin` … `lastBin`: for each
   * group of phases, `output.takePhases(v, y)` receives in y[j] the values
   * conj(M · z[D·u + v + j]) for u < L, interleaved (length 2·L), where z[t] = (1/M) Σ_k Z[k]·e^(+2πikt/M). The band is
   * given conjugated (`conjBand[i]` = conj Z[first + i]), which lets forward short
   * transforms compute the inverse: conj(IDFT(Z))·M = DFT(conj Z) (common practice).
   */
  inverseBand(
    conjBand: Float64Array,
    firstBin: number,
    lastBin: number,
    output: PhaseSink,
    scratch: BandDftScratch,
  ): void {
    const count = this.checkBand(firstBin, lastBin, conjBand, scratch);
    const l = this.subSize;
    const { phaseSpectrum, phaseOutputs, rotation } = scratch;
    const root = scratch.rootsFor(this.size, firstBin, count);
    // Only bins j = k mod L of the band are non-zero in the folded short spectrum.
    phaseSpectrum.fill(0);
    for (let i = 0; i < count; i++) {
      rotation[2 * i] = 1;
      rotation[2 * i + 1] = 0;
    }
    const firstJ = firstBin % l;
    const folds = count > l;
    for (let v = 0; v < this.decimation; v++) {
      if (folds) phaseSpectrum.fill(0);
      // conj(Z[k]·W_M^(−k·v)) = conj(Z[k])·W_M^(k·v): the same rotation as forward.
      for (let i = 0, j = firstJ; i < count; i++) {
        const zr = conjBand[2 * i];
        const zi = conjBand[2 * i + 1];
        const pr = rotation[2 * i];
        const pi = rotation[2 * i + 1];
        if (folds) {
          phaseSpectrum[2 * j] += pr * zr - pi * zi;
          phaseSpectrum[2 * j + 1] += pr * zi + pi * zr;
        } else {
          phaseSpectrum[2 * j] = pr * zr - pi * zi;
          phaseSpectrum[2 * j + 1] = pr * zi + pi * zr;
        }
        const rr = root[2 * i];
        const ri = root[2 * i + 1];
        rotation[2 * i] = pr * rr - pi * ri;
        rotation[2 * i + 1] = pr * ri + pi * rr;
        j = j + 1 === l ? 0 : j + 1;
      }
      const slot = v % PHASE_GROUP;
      this.sub.forward(phaseSpectrum, phaseOutputs[slot]);
      if (slot === PHASE_GROUP - 1 || v === this.decimation - 1) {
        output.takePhases(v - slot, phaseOutputs.slice(0, slot + 1));
      }
    }
  }

  private checkBand(
    firstBin: number,
    lastBin: number,
    band: Float64Array,
    scratch: BandDftScratch,
  ): number {
    if (!Number.isInteger(firstBin) || !Number.isInteger(lastBin)) {
      throw new RangeError(`band DFT bins: expected integers, got ${firstBin} … ${lastBin}`);
    }
    if (firstBin < 0 || lastBin < firstBin || lastBin >= this.size) {
      throw new RangeError(
        `band DFT bins: expected 0 ≤ first ≤ last < ${this.size}, got ${firstBin} … ${lastBin}`,
      );
    }
    const count = lastBin - firstBin + 1;
    if (band.length < 2 * count) {
      throw new RangeError(`band DFT band: expected length ≥ ${2 * count}, got ${band.length}`);
    }
    scratch.ensure(this.subSize, count);
    return count;
  }
}

/**
 * Short-transform length for bins first … last of an M-point DFT: a power of two
 * dividing M, at least the band width (so the band does not fold) where M allows,
 * and at least M/256, which bounds the number of rotation steps (and their rounding).
 */
export function bandSubSize(size: number, firstBin: number, lastBin: number): number {
  let twos = 1;
  while (size % (twos * 2) === 0) twos *= 2;
  const wanted = Math.max(nextPowerOfTwo(lastBin - firstBin + 1), nextPowerOfTwo(size / 256));
  return Math.max(2, Math.min(twos, wanted));
}

/** Buffers of one caller (reused across channels, never shared between concurrent calls). */
export class BandDftScratch {
  phaseInputs: Float64Array[] = [];
  phaseSpectrum = new Float64Array(0);
  phaseOutputs: Float64Array[] = [];
  rotation = new Float64Array(0);
  private root = new Float64Array(0);
  private rootKey = '';

  ensure(subSize: number, count: number): void {
    if (this.phaseSpectrum.length !== 2 * subSize) {
      this.phaseInputs = Array.from({ length: PHASE_GROUP }, () => new Float64Array(subSize));
      this.phaseSpectrum = new Float64Array(2 * subSize);
      this.phaseOutputs = Array.from({ length: PHASE_GROUP }, () => new Float64Array(2 * subSize));
    }
    if (this.rotation.length < 2 * count) this.rotation = new Float64Array(2 * count);
  }

  /** W_M^k for k = first … first + count − 1, computed once per band. */
  rootsFor(size: number, firstBin: number, count: number): Float64Array {
    const key = `${size}:${firstBin}:${count}`;
    if (key !== this.rootKey) {
      this.root = new Float64Array(2 * count);
      for (let i = 0; i < count; i++) {
        const angle = (-2 * Math.PI * (firstBin + i)) / size;
        this.root[2 * i] = Math.cos(angle);
        this.root[2 * i + 1] = Math.sin(angle);
      }
      this.rootKey = key;
    }
    return this.root;
  }
}
