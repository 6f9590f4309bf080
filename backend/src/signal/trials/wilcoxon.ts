import { normalSurvival } from './normal-distribution';

export type WilcoxonMethod = 'exact' | 'permutation' | 'normal';

export interface WilcoxonResult {
  /** min(W+, W−), as scipy reports it for the two-sided test. */
  statistic: number;
  /** Two-sided p-value. */
  pValue: number;
  method: WilcoxonMethod;
  /** Differences that are not zero (zeros are dropped, Wilcoxon's rule). */
  nonZeroCount: number;
}

/** Largest sample for the exact null distribution (scipy's default switch, n ≤ 50). */
const EXACT_MAX_N = 50;
/** Samples with ties or zeros up to this size get the full sign-flip enumeration (2^13). */
const PERMUTATION_MAX_N = 13;

/**
 * Wilcoxon signed-rank test of paired differences against a median of 0, two-sided
 * with the choices of the `scipy.stats.wilcoxon` defaults (scipy docs): zeros dropped ("wilcox"), average ranks for tied |d|, no continuity
 * correction; exact null distribution for n ≤ 50 without ties or zeros; otherwise all
 * 2^n sign flips when n ≤ 13; otherwise the normal approximation with the tie term
 * σ² = [n(n+1)(2n+1) − Σ(t³ − t)/2]/24. Here n counts the differences before zeros
 * are dropped, as scipy does when it picks the method.
 */
export function wilcoxonSignedRank(differences: ArrayLike<number>): WilcoxonResult {
  const all = Array.from(differences);
  if (all.some((d) => !Number.isFinite(d))) {
    throw new RangeError('differences: expected finite numbers, found NaN or infinity');
  }
  const total = all.length;
  const d = all.filter((v) => v !== 0);
  const n = d.length;
  if (total === 0 || n === 0) {
    return { statistic: NaN, pValue: NaN, method: 'normal', nonZeroCount: n };
  }
  const { ranks, tieTerm, hasTies } = averageRanks(d.map(Math.abs));
  let rPlus = 0;
  let rMinus = 0;
  for (let i = 0; i < n; i++) {
    if (d[i] > 0) rPlus += ranks[i];
    else rMinus += ranks[i];
  }
  const statistic = Math.min(rPlus, rMinus);
  const zeros = total - n;
  if (total <= EXACT_MAX_N && !hasTies && zeros === 0) {
    return { statistic, pValue: exactPValue(n, rPlus), method: 'exact', nonZeroCount: n };
  }
  if (total <= EXACT_MAX_N && total <= PERMUTATION_MAX_N) {
    return {
      statistic,
      pValue: signFlipPValue(d, ranks, rPlus),
      method: 'permutation',
      nonZeroCount: n,
    };
  }
  const mean = (n * (n + 1)) / 4;
  const sd = Math.sqrt((n * (n + 1) * (2 * n + 1) - tieTerm / 2) / 24);
  const z = (rPlus - mean) / sd;
  const pValue = 2 * normalSurvival(Math.abs(z));
  return { statistic, pValue, method: 'normal', nonZeroCount: n };
}

/** Average ranks (1-based) of `values`, and Σ(t³ − t) over groups of t tied values. */
function averageRanks(values: number[]): { ranks: number[]; tieTerm: number; hasTies: boolean } {
  const n = values.length;
  const order = values.map((_, i) => i).sort((a, b) => values[a] - values[b]);
  const ranks = new Array<number>(n);
  let tieTerm = 0;
  let hasTies = false;
  for (let start = 0; start < n;) {
    let end = start + 1;
    while (end < n && values[order[end]] === values[order[start]]) end++;
    const t = end - start;
    const rank = start + 1 + (t - 1) / 2;
    for (let j = start; j < end; j++) ranks[order[j]] = rank;
    if (t > 1) {
      hasTies = true;
      tieTerm += t * t * t - t;
    }
    start = end;
  }
  return { ranks, tieTerm, hasTies };
}

/**
 * Exact two-sided p = 2·min(P(W+ ≥ ⌊w⌋), P(W+ ≤ ⌈w⌉)), capped at 1, from the number of
 * subsets of {1…n} with each rank sum (the null distribution of W+ without ties).
 */
function exactPValue(n: number, rPlus: number): number {
  const maxSum = (n * (n + 1)) / 2;
  const counts = new Float64Array(maxSum + 1);
  counts[0] = 1;
  for (let r = 1; r <= n; r++) {
    for (let s = maxSum; s >= r; s--) counts[s] += counts[s - r];
  }
  const totalWays = Math.pow(2, n);
  const upper = Math.floor(rPlus);
  const lower = Math.ceil(rPlus);
  let sf = 0;
  for (let s = upper; s <= maxSum; s++) sf += counts[s];
  let cdf = 0;
  for (let s = 0; s <= lower; s++) cdf += counts[s];
  return Math.min(1, (2 * Math.min(sf, cdf)) / totalWays);
}

/**
 * Two-sided p from all 2^n sign flips of the differences, with scipy's
 * `permutation_test` comparison tolerance (100 machine epsilons relative to W+).
 */
function signFlipPValue(d: number[], ranks: number[], observed: number): number {
  const n = d.length;
  const flips = 1 << n;
  const gamma = Math.abs(observed) * 100 * Number.EPSILON;
  let less = 0;
  let greater = 0;
  for (let mask = 0; mask < flips; mask++) {
    let w = 0;
    for (let i = 0; i < n; i++) if (mask & (1 << i)) w += ranks[i];
    if (w <= observed + gamma) less++;
    if (w >= observed - gamma) greater++;
  }
  return Math.min(1, (2 * Math.min(less, greater)) / flips);
}
