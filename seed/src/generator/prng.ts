/**
 * A small deterministic pseudo-random generator, so that a seed always gives the same
 * demo files on every machine and Node version (Math.random cannot be seeded).
 *
 * xorshift128 (four 32-bit words, shifts 11/8/19; common practice, constants from
 * memory) for uniform numbers, seeded through FNV-1a 32-bit hashing of a text key
 * (common practice), and the Box–Muller transform for normal deviates (common practice).
 * Good enough for synthetic noise; not for cryptography.
 */
export class SeededRandom {
  private x: number;
  private y: number;
  private z: number;
  private w: number;
  private spareNormal: number | null = null;

  /** `key` names the stream: the same key gives the same sequence. */
  constructor(key: string) {
    let h = fnv1a32(key);
    // Spread one hash into four non-zero state words (xorshift must not start at all-zero).
    const next = (): number => {
      h = (Math.imul(h ^ (h >>> 16), 0x85ebca6b) + 0x9e3779b9) >>> 0;
      return h === 0 ? 0x6d2b79f5 : h;
    };
    this.x = next();
    this.y = next();
    this.z = next();
    this.w = next();
    // The first outputs of a freshly seeded xorshift are poorly mixed: discard a few.
    for (let i = 0; i < 16; i++) this.nextUint32();
  }

  /** A new independent-looking stream derived from this one's key and a sub-key. */
  static derive(key: string, subKey: string): SeededRandom {
    return new SeededRandom(`${key}/${subKey}`);
  }

  nextUint32(): number {
    const t = this.x ^ (this.x << 11);
    this.x = this.y;
    this.y = this.z;
    this.z = this.w;
    this.w = (this.w ^ (this.w >>> 19) ^ (t ^ (t >>> 8))) >>> 0;
    return this.w;
  }

  /** Uniform in [0, 1). */
  uniform(): number {
    return this.nextUint32() / 4294967296;
  }

  /** Uniform in [min, max). */
  between(min: number, max: number): number {
    return min + (max - min) * this.uniform();
  }

  /** Standard normal deviate (Box–Muller, both values used). */
  normal(): number {
    if (this.spareNormal !== null) {
      const spare = this.spareNormal;
      this.spareNormal = null;
      return spare;
    }
    let u = 0;
    while (u === 0) u = this.uniform();
    const v = this.uniform();
    const radius = Math.sqrt(-2 * Math.log(u));
    this.spareNormal = radius * Math.sin(2 * Math.PI * v);
    return radius * Math.cos(2 * Math.PI * v);
  }
}

/** FNV-1a, 32-bit, over the UTF-16 code units of `text` (common practice). */
export function fnv1a32(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash >>> 0;
}
