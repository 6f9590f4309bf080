/**
 * Real, non-negative frequency responses applied by one spectral multiplication.
 * A real response has zero phase, so the filtered time course is not shifted
 * (docs/method.md §2: a phase delay would shift the whole frequency time course).
 */
export interface SpectralWeight {
  /** Frequencies outside [lo, hi] get weight 0; only bins inside are evaluated. */
  supportHz: readonly [number, number];
  /** Weight at a frequency in Hz (≥ 0). */
  weightAt(frequencyHz: number): number;
}

export interface PlateauBandOptions {
  /** Pass band [low, high] in Hz, with gain 1 inside. */
  bandHz: readonly [number, number];
  /**
   * Width of each transition zone as a fraction of its band edge (default 0.15):
   * the gain rises from 0 at low·(1 − t) to 1 at low and falls from 1 at high to 0 at
   * high·(1 + t). The plateau with 15 % transition zones follows Cohen 2014.
   */
  transitionFraction?: number;
}

export const DEFAULT_TRANSITION_FRACTION = 0.15;

/**
 * Plateau band-pass response. The transition zones are raised-cosine ramps rather
 * than straight lines: the smooth corners make the impulse response decay faster,
 * so fewer samples at the recording edges are disturbed (common practice).
 */
export function plateauBandPass(options: PlateauBandOptions): SpectralWeight {
  const [low, high] = options.bandHz;
  const t = options.transitionFraction ?? DEFAULT_TRANSITION_FRACTION;
  if (!(low > 0) || !(high > low)) {
    throw new RangeError(`bandHz: expected 0 < low < high, got [${options.bandHz.join(', ')}] Hz`);
  }
  if (!(t > 0) || !(t < 1)) {
    throw new RangeError(`transitionFraction: expected a value in (0, 1), got ${t}`);
  }
  const lowStop = low * (1 - t);
  const highStop = high * (1 + t);
  return {
    supportHz: [lowStop, highStop],
    weightAt(f: number): number {
      if (f <= lowStop || f >= highStop) return 0;
      if (f < low) return 0.5 - 0.5 * Math.cos((Math.PI * (f - lowStop)) / (low - lowStop));
      if (f <= high) return 1;
      return 0.5 + 0.5 * Math.cos((Math.PI * (f - high)) / (highStop - high));
    },
  };
}

export interface MorletOptions {
  /** Centre frequency in Hz, usually the individual alpha frequency. */
  centreHz: number;
  /** Number of cycles (default 7), which sets the time/frequency trade-off. */
  cycles?: number;
}

export const DEFAULT_MORLET_CYCLES = 7;

/**
 * Frequency response of a complex Morlet wavelet e^(2πi·f0·t)·e^(−t²/2σt²) with
 * σt = cycles/(2π·f0): a Gaussian centred on f0 with σf = f0/cycles, scaled to gain 1
 * at f0 so that a tone at f0 keeps its amplitude (Cohen 2014 uses this wavelet as the
 * alternative to the plateau filter).
 */
export function morletWavelet(options: MorletOptions): SpectralWeight {
  const f0 = options.centreHz;
  const cycles = options.cycles ?? DEFAULT_MORLET_CYCLES;
  if (!(f0 > 0)) throw new RangeError(`centreHz: expected a positive frequency, got ${f0}`);
  if (!(cycles > 0)) throw new RangeError(`cycles: expected a positive number, got ${cycles}`);
  const sigmaHz = f0 / cycles;
  // Beyond 6 σ the weight is below 1.6e-8: treat it as zero.
  return {
    supportHz: [Math.max(0, f0 - 6 * sigmaHz), f0 + 6 * sigmaHz],
    weightAt(f: number): number {
      const u = (f - f0) / sigmaHz;
      return Math.exp(-0.5 * u * u);
    },
  };
}
