import { seededUniform } from '../signal/onset/random';

/**
 * Seeded randomness for the fuzzer and the crash test. Every draw comes from one
 * generator per case (or per run), so a seed and a case number name one input exactly:
 * a failure seen once can be replayed alone, on any machine.
 */
export class Rng {
  private readonly next: () => number;

  constructor(seed: number) {
    // The signal core's mulberry32: one generator for the whole backend (common practice).
    this.next = seededUniform(seed);
  }

  /** Uniform on [0, 1). */
  float(): number {
    return this.next();
  }

  /** Uniform integer in [min, max] (both included). */
  int(min: number, max: number): number {
    return min + Math.floor(this.next() * (max - min + 1));
  }

  bool(probability = 0.5): boolean {
    return this.next() < probability;
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

/**
 * The seed of case `index` of a run seeded with `seed`: a 32-bit mix (the murmur3
 * finaliser, common practice), so neighbouring cases get unrelated generators and any
 * case can be rebuilt without drawing the ones before it.
 */
export function caseSeed(seed: number, index: number): number {
  let h = (Math.imul(seed | 0, 0x9e3779b1) ^ Math.imul(index + 1, 0x85ebca6b)) | 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h | 0;
}
