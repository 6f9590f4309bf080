const SQRT_PI = Math.sqrt(Math.PI);

/**
 * Complementary error function to near double precision: the Maclaurin series of
 * erf below 2 and the continued fraction erfc(x) = e^(−x²)/√π · 1/(x + ½/(x + 1/(x +
 * 3/2/(x + …)))) evaluated by Lentz's method above (standard expansions, common
 * practice, from memory; the tests compare p-values with scipy).
 */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x < 0) return 2 - erfc(-x);
  if (x < 2) {
    let term = x;
    let sum = x;
    const x2 = x * x;
    for (let n = 1; n < 200; n++) {
      term *= -x2 / n;
      const add = term / (2 * n + 1);
      sum += add;
      if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
    }
    return 1 - (2 / SQRT_PI) * sum;
  }
  if (x > 27) return 0;
  // Lentz: f = x + a1/(x + a2/(x + …)), a_n = n/2.
  const tiny = 1e-300;
  let f = x;
  let c = x;
  let d = 0;
  for (let n = 1; n < 500; n++) {
    const a = n / 2;
    d = x + a * d;
    d = d === 0 ? tiny : 1 / d;
    c = x + a / c;
    if (c === 0) c = tiny;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-x * x) / (SQRT_PI * f);
}

/** Upper tail of the standard normal distribution, P(Z > z) = ½·erfc(z/√2). */
export function normalSurvival(z: number): number {
  return 0.5 * erfc(z / Math.SQRT2);
}
