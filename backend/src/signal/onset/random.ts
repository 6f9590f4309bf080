/**
 * Seeded uniform generator on [0, 1) ("mulberry32", a public-domain 32-bit generator;
 * common practice, constants from memory). Fixed seeds make a rerun give the same
 * bootstrap interval (docs/method.md §3). Each call owns its own state.
 */
export function seededUniform(seed: number): () => number {
  let state = seed | 0;
  return () => {
    state = (state + 0x6d2b79f5) | 0;
    let t = Math.imul(state ^ (state >>> 15), 1 | state);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
