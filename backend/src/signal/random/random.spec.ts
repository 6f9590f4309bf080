import { execFileSync } from 'node:child_process';
import { fnv1a32, mixSeed, SeededRandom, seededNormal, seededUniform } from './random';

describe('SeededRandom', () => {
  it('gives the same sequence for the same key and a different one for another key', () => {
    const a = new SeededRandom('demo/a');
    const b = new SeededRandom('demo/a');
    const c = new SeededRandom('demo/b');
    const seqA = Array.from({ length: 100 }, () => a.uniform());
    const seqB = Array.from({ length: 100 }, () => b.uniform());
    const seqC = Array.from({ length: 100 }, () => c.uniform());
    expect(seqB).toEqual(seqA);
    expect(seqC.filter((v, i) => v === seqA[i]).length).toBeLessThan(2);
  });

  it('draws uniform numbers with the moments of U(0,1): mean 1/2, variance 1/12 (closed form)', () => {
    const rng = new SeededRandom('moments/uniform');
    const n = 200_000;
    let sum = 0;
    let sumSq = 0;
    let min = 1;
    let max = 0;
    for (let i = 0; i < n; i++) {
      const u = rng.uniform();
      sum += u;
      sumSq += u * u;
      min = Math.min(min, u);
      max = Math.max(max, u);
    }
    const mean = sum / n;
    // Standard error of the mean is sqrt(1/12/n) ≈ 0.00065: 0.003 is about 5 of them.
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.003);
    expect(Math.abs(sumSq / n - mean * mean - 1 / 12)).toBeLessThan(0.002);
    expect(min).toBeGreaterThanOrEqual(0);
    expect(max).toBeLessThan(1);
  });

  it('draws normal deviates: mean 0, variance 1, P(|x| < 1) = erf(1/√2) ≈ 0.6827 (closed form)', () => {
    const rng = new SeededRandom('moments/normal');
    const n = 200_000;
    let sum = 0;
    let sumSq = 0;
    let inside = 0;
    for (let i = 0; i < n; i++) {
      const x = rng.normal();
      sum += x;
      sumSq += x * x;
      if (Math.abs(x) < 1) inside++;
    }
    expect(Math.abs(sum / n)).toBeLessThan(0.012);
    expect(Math.abs(sumSq / n - 1)).toBeLessThan(0.015);
    expect(Math.abs(inside / n - 0.682689)).toBeLessThan(0.005);
  });
});

describe('one generator underneath', () => {
  it('draws the bootstrap stream: a number seed gives seededUniform(seed) and seededNormal(seed) exactly', () => {
    const uniform = seededUniform(20240506);
    const fromClass = new SeededRandom(20240506);
    for (let i = 0; i < 1000; i++) expect(fromClass.uniform()).toBe(uniform());
    const normal = seededNormal(7);
    const normalFromClass = new SeededRandom(7);
    for (let i = 0; i < 1000; i++) expect(normalFromClass.normal()).toBe(normal());
  });

  it('draws integers over the whole closed range, each about equally often (closed form: n/6 each)', () => {
    const rng = new SeededRandom('moments/int');
    const counts = new Map<number, number>();
    for (let i = 0; i < 60_000; i++) {
      const k = rng.int(1, 6);
      counts.set(k, (counts.get(k) ?? 0) + 1);
    }
    expect([...counts.keys()].sort()).toEqual([1, 2, 3, 4, 5, 6]);
    // Binomial standard deviation sqrt(60000·(1/6)·(5/6)) ≈ 91: 500 is above 5 of them.
    for (const count of counts.values()) expect(Math.abs(count - 10_000)).toBeLessThan(500);
  });

  it('gives neighbouring items unrelated seeds (mixSeed)', () => {
    const seeds = Array.from({ length: 1000 }, (_, i) => mixSeed(42, i));
    expect(new Set(seeds).size).toBe(1000);
    expect(mixSeed(42, 3)).toBe(mixSeed(42, 3));
  });
});

describe('fnv1a32', () => {
  it('matches an independent Python implementation of FNV-1a (32-bit)', () => {
    // The FNV-1a definition: offset basis 2166136261, prime 16777619 (constants from memory).
    const script =
      'import sys\nfor s in sys.stdin.read().split("\\n"):\n  h=2166136261\n  for c in s.encode():\n    h=((h^c)*16777619)&0xffffffff\n  print(h)';
    const words = ['', 'a', 'foobar', 'gyre-demo-v1/LAF-C101'];
    const out = execFileSync('python3', ['-c', script], { input: words.join('\n') });
    const expected = out.toString().trim().split('\n').map(Number);
    expect(words.map(fnv1a32)).toEqual(expected);
    // Published FNV-1a test vector for "a" (from memory).
    expect(fnv1a32('a')).toBe(0xe40c292c);
  });
});
