/**
 * Gyre's one seeded random-number module: the bootstrap's draws (docs/method.md §3), the
 * generated test and demo recordings, the fuzzer and the crash test all draw from here, so a
 * seed names one sequence on every machine and Node version (Math.random cannot be seeded).
 * Hand-written: four small functions, and the bootstrap's fixed-seed intervals depend on this
 * exact stream. Not for cryptography.
 */

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

/** Standard normal values from `seededUniform(seed)` (Box–Muller, both values used; common practice). */
export function seededNormal(seed: number): () => number {
  const random = new SeededRandom(seed);
  return () => random.normal();
}

/** FNV-1a, 32-bit, over the UTF-16 code units of `text` (common practice): a named stream's seed. */
export function fnv1a32(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash >>> 0;
}

/**
 * The seed of item `index` of a run seeded with `seed`: a 32-bit mix (the murmur3
 * finaliser, common practice), so neighbouring items get unrelated streams and any item
 * can be rebuilt without drawing the ones before it.
 */
export function mixSeed(seed: number, index: number): number {
  let h = (Math.imul(seed | 0, 0x9e3779b1) ^ Math.imul(index + 1, 0x85ebca6b)) | 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h | 0;
}

/**
 * One seeded stream (mulberry32 underneath) with the draws Gyre needs. A number seed gives
 * the same uniforms as `seededUniform(seed)`; a text key names a stream (hashed with FNV-1a),
 * and `derive(key, subKey)` names an independent-looking stream within it.
 */
export class SeededRandom {
  private readonly next: () => number;
  private spareNormal: number | null = null;

  constructor(seed: number | string) {
    this.next = seededUniform(typeof seed === 'string' ? fnv1a32(seed) : seed);
  }

  /** The stream named `key/subKey`. */
  static derive(key: string, subKey: string): SeededRandom {
    return new SeededRandom(`${key}/${subKey}`);
  }

  /** Uniform on [0, 1). */
  uniform(): number {
    return this.next();
  }

  /** Uniform on [min, max). */
  between(min: number, max: number): number {
    return min + (max - min) * this.next();
  }

  /** Uniform integer in [min, max] (both included). */
  int(min: number, max: number): number {
    return min + Math.floor(this.next() * (max - min + 1));
  }

  /** True with `probability`. */
  bool(probability = 0.5): boolean {
    return this.next() < probability;
  }

  /** Standard normal deviate (Box–Muller on 1 − u, u: never log(0); common practice). */
  normal(): number {
    if (this.spareNormal !== null) {
      const spare = this.spareNormal;
      this.spareNormal = null;
      return spare;
    }
    const u = 1 - this.next();
    const v = this.next();
    const radius = Math.sqrt(-2 * Math.log(u));
    this.spareNormal = radius * Math.sin(2 * Math.PI * v);
    return radius * Math.cos(2 * Math.PI * v);
  }

  pick<T>(items: readonly T[]): T {
    if (items.length === 0) throw new RangeError('pick from an empty list');
    return items[this.int(0, items.length - 1)];
  }

  /** One of `items`, each as likely as its weight. */
  weighted<T>(items: ReadonlyArray<readonly [T, number]>): T {
    const total = items.reduce((sum, [, w]) => sum + w, 0);
    let at = this.next() * total;
    for (const [item, weight] of items) {
      at -= weight;
      if (at < 0) return item;
    }
    return items[items.length - 1][0];
  }

  bytes(length: number): Uint8Array {
    const out = new Uint8Array(length);
    for (let i = 0; i < length; i++) out[i] = this.int(0, 255);
    return out;
  }
}
