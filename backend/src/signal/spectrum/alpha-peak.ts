import { PowerSpectrum } from './welch';

export interface AlphaPeakOptions {
  /** Where the peak is searched, Hz (default 7–13, docs/method.md §4). */
  searchHz?: readonly [number, number];
  /** Range of the 1/f background fit, Hz (default 2–40, capped below Nyquist). */
  backgroundFitHz?: readonly [number, number];
  /** Excluded from the background fit, Hz (default 6–14: alpha and its shoulders). */
  backgroundExcludeHz?: readonly [number, number];
  /** Least height above the 1/f background for a clear peak, dB (default 3 dB, ×2 power). */
  minProminenceDb?: number;
}

export type NoPeakReason = 'peak-at-search-edge' | 'below-prominence' | 'no-power';

export interface AlphaPeak {
  /** Peak alpha frequency in Hz, or null when there is no clear peak. */
  pafHz: number | null;
  /** Frequency of the highest bin in the search window (before interpolation), Hz. */
  highestBinHz: number | null;
  /** Height of the highest bin above the fitted 1/f background, dB. */
  prominenceDb: number | null;
  /** Why `pafHz` is null. */
  noPeakReason: NoPeakReason | null;
  /** Fitted background log10 P = intercept + slope·log10 f. */
  background: { intercept: number; slope: number } | null;
}

const DEFAULTS = {
  searchHz: [7, 13] as const,
  backgroundFitHz: [2, 40] as const,
  backgroundExcludeHz: [6, 14] as const,
  minProminenceDb: 3,
};

/**
 * 1/f background of a spectrum: least-squares line log10 P = a + b·log10 f over
 * `fitHz` without `excludeHz` (the aperiodic fit behind the robust IAF estimate of
 * Corcoran et al. 2018, Psychophysiology 55:e13064, here in its simplest form).
 */
export function fitBackground(
  spectrum: PowerSpectrum,
  fitHz: readonly [number, number],
  excludeHz: readonly [number, number],
): { intercept: number; slope: number } | null {
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  const { frequencyHz: f, powerPerHz: p } = spectrum;
  for (let k = 0; k < f.length; k++) {
    if (f[k] < fitHz[0] || f[k] > fitHz[1]) continue;
    if (f[k] >= excludeHz[0] && f[k] <= excludeHz[1]) continue;
    if (!(p[k] > 0)) continue;
    const x = Math.log10(f[k]);
    const y = Math.log10(p[k]);
    n++;
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
  }
  const det = n * sxx - sx * sx;
  if (n < 3 || !(Math.abs(det) > 0)) return null;
  const slope = (n * sxy - sx * sy) / det;
  return { intercept: (sy - slope * sx) / n, slope };
}

/**
 * Peak alpha frequency (docs/method.md §4): the highest bin in `searchHz`, refined by a
 * parabola through the log power of it and its two neighbours (vertex offset
 * δ = ½·(y₋ − y₊)/(y₋ − 2y₀ + y₊) bins; common practice). Gyre's "clear peak" rule:
 * the highest bin must be a local maximum inside the window (not on its edge) and
 * stand at least `minProminenceDb` above the fitted 1/f background; otherwise the
 * answer is null with the reason. No answer is forced.
 */
export function alphaPeak(spectrum: PowerSpectrum, options: AlphaPeakOptions = {}): AlphaPeak {
  const searchHz = options.searchHz ?? DEFAULTS.searchHz;
  const nyquist = spectrum.frequencyHz[spectrum.frequencyHz.length - 1];
  const fitRange = options.backgroundFitHz ?? DEFAULTS.backgroundFitHz;
  const fitHz: [number, number] = [fitRange[0], Math.min(fitRange[1], 0.8 * nyquist)];
  const excludeHz = options.backgroundExcludeHz ?? DEFAULTS.backgroundExcludeHz;
  const minProminenceDb = options.minProminenceDb ?? DEFAULTS.minProminenceDb;
  const { frequencyHz: f, powerPerHz: p } = spectrum;
  let best = -1;
  let first = -1;
  let last = -1;
  for (let k = 0; k < f.length; k++) {
    if (f[k] < searchHz[0] || f[k] > searchHz[1]) continue;
    if (first < 0) first = k;
    last = k;
    if (best < 0 || p[k] > p[best]) best = k;
  }
  const background = fitBackground(spectrum, fitHz, excludeHz);
  if (best < 0 || !(p[best] > 0)) {
    return {
      pafHz: null,
      highestBinHz: null,
      prominenceDb: null,
      noPeakReason: 'no-power',
      background,
    };
  }
  const prominenceDb = background
    ? 10 * (Math.log10(p[best]) - (background.intercept + background.slope * Math.log10(f[best])))
    : null;
  const result = { highestBinHz: f[best], prominenceDb, background };
  if (best === first || best === last || best === 0 || best === f.length - 1) {
    return { ...result, pafHz: null, noPeakReason: 'peak-at-search-edge' };
  }
  if (prominenceDb === null || prominenceDb < minProminenceDb) {
    return { ...result, pafHz: null, noPeakReason: 'below-prominence' };
  }
  const ym = Math.log10(p[best - 1]);
  const y0 = Math.log10(p[best]);
  const yp = Math.log10(p[best + 1]);
  const denominator = ym - 2 * y0 + yp;
  const delta = denominator < 0 ? (0.5 * (ym - yp)) / denominator : 0;
  const binHz = f[1] - f[0];
  return { ...result, pafHz: f[best] + delta * binHz, noPeakReason: null };
}

/**
 * Centre of gravity of the alpha band, CoG = Σ f·P(f) / Σ P(f) over `bandHz`
 * (Klimesch 1999, "EEG alpha and theta oscillations reflect cognitive and memory
 * performance", Brain Res. Rev. 29:169–195). Null when the band holds no power.
 */
export function centreOfGravity(
  spectrum: PowerSpectrum,
  options: { bandHz?: readonly [number, number] } = {},
): number | null {
  const bandHz = options.bandHz ?? DEFAULTS.searchHz;
  let weighted = 0;
  let total = 0;
  const { frequencyHz: f, powerPerHz: p } = spectrum;
  for (let k = 0; k < f.length; k++) {
    if (f[k] < bandHz[0] || f[k] > bandHz[1]) continue;
    weighted += f[k] * p[k];
    total += p[k];
  }
  return total > 0 ? weighted / total : null;
}
