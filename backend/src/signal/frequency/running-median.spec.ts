import { readScipyFixture } from '../testing/scipy-fixtures';
import {
  FrequencySlidingWorkspace,
  medianFilterFrequency,
  medianWindowLengths,
} from './frequency-sliding';
import { medianAcross, TEN_INPUT_NETWORK } from './median-across';
import { ArgsortWorkspace, argsortFloat64, rankFloat64 } from './radix-argsort';
import { runningMedian, runningMedians, RunningMedianWorkspace } from './running-median';
import { seededUniform } from '../random/random';

interface MedianFixture {
  input: number[];
  windowsSamples: number[];
  filtered: number[][];
  medianAcross: number[];
}

const fixture = readScipyFixture<MedianFixture>('median-filter.json');

/**
 * The definition: sort each window, mirrored at the edges like scipy's 'reflect', and take its
 * middle element. A typed array's default sort is numeric with NaN last (ECMAScript,
 * TypedArray SortCompare), the order the running median documents (numpy.sort's too).
 */
function windowMedians(x: Float64Array, k: number): Float64Array {
  const n = x.length;
  const h = (k - 1) / 2;
  const reflect = (i: number): number => {
    const p = 2 * n;
    const j = ((i % p) + p) % p;
    return j < n ? j : p - 1 - j;
  };
  const out = new Float64Array(n);
  const w = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    for (let j = -h; j <= h; j++) w[j + h] = x[reflect(i + j)];
    out[i] = w.sort()[h];
  }
  return out;
}

describe('running median', () => {
  it('is identical to scipy.ndimage.median_filter(mode="reflect") for all 10 windows', () => {
    const x = Float64Array.from(fixture.input);
    const outputs = fixture.windowsSamples.map(() => new Float64Array(x.length));
    runningMedians(
      x,
      { windowsSamples: fixture.windowsSamples },
      new RunningMedianWorkspace(),
      outputs,
    );
    outputs.forEach((out, i) => {
      // Exact: a median selects one of the inputs, so the values must be equal, edges included.
      expect(Array.from(out)).toEqual(fixture.filtered[i]);
    });
  });

  it('takes the median across the 10 filtered series like numpy.median(axis=0)', () => {
    const series = fixture.filtered.map((f) => Float64Array.from(f));
    const out = medianAcross(series, new Float64Array(fixture.input.length));
    // The mean of the two middle values is rounded to 13 digits in the fixture.
    let worst = 0;
    out.forEach((v, i) => {
      worst = Math.max(
        worst,
        Math.abs(v - fixture.medianAcross[i]) / Math.abs(fixture.medianAcross[i]),
      );
    });
    expect(worst).toBeLessThan(1e-12);
  });

  it('agrees with sorting every window, for short inputs, ties and windows longer than the input', () => {
    // Generated inputs: small integers plus fractions, so many values tie.
    const random = seededUniform(5);
    const ws = new RunningMedianWorkspace();
    for (const n of [1, 2, 3, 10, 37, 256]) {
      for (const k of [1, 3, 5, 9, 21, 51, 201]) {
        const x = new Float64Array(n);
        for (let i = 0; i < n; i++)
          x[i] = Math.floor(random() * 7) - 3 + (random() < 0.5 ? 0 : random());
        expect(Array.from(runningMedian(x, { windowSamples: k }, ws))).toEqual(
          Array.from(windowMedians(x, k)),
        );
      }
    }
  });

  it('leaves NaN out like scipy.ndimage.generic_filter(numpy.nanmedian, mode="reflect")', () => {
    const nanFixture = readScipyFixture<{
      input: (number | null)[];
      windowsSamples: number[];
      filtered: (number | null)[][];
    }>('nan-median-filter.json');
    const x = Float64Array.from(nanFixture.input, (v) => v ?? NaN);
    const ws = new RunningMedianWorkspace();
    for (const chunkSamples of [7, 2048]) {
      const outputs = nanFixture.windowsSamples.map(() => new Float64Array(x.length));
      runningMedians(
        x,
        { windowsSamples: nanFixture.windowsSamples, chunkSamples, skipNaN: true },
        ws,
        outputs,
      );
      outputs.forEach((out, w) => {
        const expected = nanFixture.filtered[w];
        out.forEach((v, i) => {
          const e = expected[i];
          if (e === null) expect(v).toBeNaN();
          // The mean of two middle values is rounded to 13 digits in the fixture.
          else expect(Math.abs(v - e)).toBeLessThanOrEqual(1e-12 * Math.abs(e));
        });
      });
    }
    // Without NaN, skipping changes nothing: the same values as the plain median.
    const plain = Float64Array.from(fixture.input);
    const skipped = fixture.windowsSamples.map(() => new Float64Array(plain.length));
    runningMedians(plain, { windowsSamples: fixture.windowsSamples, skipNaN: true }, ws, skipped);
    skipped.forEach((out, i) => expect(Array.from(out)).toEqual(fixture.filtered[i]));
  });

  it('refuses an even window', () => {
    expect(() => runningMedian(new Float64Array(10), { windowSamples: 4 })).toThrow(
      /odd positive integer, got 4/,
    );
  });

  it('spaces 10 odd windows from 10 to 400 ms (Cohen 2014)', () => {
    expect(medianWindowLengths({ sampleRateHz: 500 })).toEqual([
      5, 27, 49, 71, 93, 113, 135, 157, 179, 201,
    ]);
    for (const fs of [250, 256, 1000]) {
      const lengths = medianWindowLengths({ sampleRateHz: fs });
      expect(lengths).toHaveLength(10);
      expect(lengths.every((k) => k % 2 === 1)).toBe(true);
      expect(Math.abs(lengths[9] - 0.4 * fs)).toBeLessThanOrEqual(1);
    }
  });

  it('uses a ten-input network that sorts every zero-one input (0-1 principle)', () => {
    // Knuth's 0-1 principle: a comparator network sorts all inputs iff it sorts all 0-1 inputs.
    for (let mask = 0; mask < 1 << 10; mask++) {
      const v = Array.from({ length: 10 }, (_, i) => (mask >> i) & 1);
      for (const [a, b] of TEN_INPUT_NETWORK) {
        if (v[a] > v[b]) [v[a], v[b]] = [v[b], v[a]];
      }
      expect(v.every((x, i) => i === 0 || v[i - 1] <= x)).toBe(true);
    }
    // The unrolled code must match the listed network: compare with a plain sort.
    const series = Array.from({ length: 10 }, (_, s) =>
      Float64Array.from({ length: 200 }, (_, i) => Math.sin(i * (s + 1) * 0.37) + s * 0.01),
    );
    const out = medianAcross(series, new Float64Array(200));
    for (let i = 0; i < 200; i++) {
      const column = series.map((x) => x[i]).sort((a, b) => a - b);
      expect(out[i]).toBe((column[4] + column[5]) / 2);
    }
  });
});

describe('running median in chunks', () => {
  // Generated input with ties and outliers; values are compared exactly, because a median
  // selects one of the inputs (the chunking must not change a single value).
  const random = seededUniform(11);
  const n = 3001;
  const x = Float64Array.from({ length: n }, (_, i) =>
    random() < 0.02 ? 40 * random() : 10 + Math.sin(i / 50) + Math.round(random() * 8) / 8,
  );
  const windows = [1, 5, 27, 201];

  it.each([1, 7, 100, 1024, 5000])(
    'equals sorting every window for chunks of %i outputs',
    (chunkSamples) => {
      const outputs = windows.map(() => new Float64Array(n));
      runningMedians(
        x,
        { windowsSamples: windows, chunkSamples },
        new RunningMedianWorkspace(),
        outputs,
      );
      windows.forEach((k, i) => {
        expect(Array.from(outputs[i])).toEqual(Array.from(windowMedians(x, k)));
      });
    },
  );

  it('fuses the median across windows chunk by chunk (medianFilterFrequency)', () => {
    const ten = medianWindowLengths({ sampleRateHz: 500 });
    const outputs = ten.map(() => new Float64Array(n));
    runningMedians(
      x,
      { windowsSamples: ten, chunkSamples: n },
      new RunningMedianWorkspace(),
      outputs,
    );
    const expected = medianAcross(outputs, new Float64Array(n));
    const fused = medianFilterFrequency(x, ten, new FrequencySlidingWorkspace());
    expect(Array.from(fused)).toEqual(Array.from(expected));
  });

  it('refuses a chunk length that is not a positive integer', () => {
    expect(() =>
      runningMedian(x, { windowSamples: 5, chunkSamples: 0 }, new RunningMedianWorkspace()),
    ).toThrow(/chunkSamples: expected a positive integer, got 0/);
  });
});

describe('argsortFloat64', () => {
  it('orders like a stable comparison sort, also where high 32-bit words tie', () => {
    // Generated: 100 values 1 + k·2^-40 share their high word (the long-run path), plus
    // negatives, zeros, repeated values and NaN (sorted last, as the doc says).
    const values = Float64Array.from([
      ...Array.from({ length: 100 }, (_, k) => 1 + ((k * 37) % 100) * 2 ** -40),
      -3.5,
      2,
      -0.25,
      0,
      2,
      1e-300,
      -1e300,
      NaN,
      7,
      1 + 2 ** -40,
      5,
      5,
      5,
      -3.5,
    ]);
    const order = new Int32Array(values.length);
    argsortFloat64(values, order, new ArgsortWorkspace());
    const expected = Array.from(values.keys()).sort((a, b) => {
      const [x, y] = [values[a], values[b]];
      if (Number.isNaN(x) || Number.isNaN(y))
        return Number(Number.isNaN(x)) - Number(Number.isNaN(y));
      return x - y || a - b;
    });
    expect(Array.from(order)).toEqual(expected);
  });
});

describe('running median, randomized against sorting every window', () => {
  // A seeded generator (the one above), so that a failure names a case that can be rerun.
  let seed = 20240301;
  const random = (): number => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  const int = (lo: number, hi: number): number => lo + Math.floor(random() * (hi - lo + 1));

  /** Inputs with continuous values, many ties, long plateaus, ramps, outliers and NaN. */
  function generate(kind: number, n: number): Float64Array {
    const x = new Float64Array(n);
    let level = 10;
    for (let i = 0; i < n; i++) {
      switch (kind) {
        case 0: // continuous, both signs (high words differ in every bit)
          x[i] = (random() - 0.5) * 10 ** int(-3, 3);
          break;
        case 1: // four levels: most windows hold ties
          x[i] = int(0, 3);
          break;
        case 2: // plateaus of random length, at the same few levels
          if (random() < 0.05) level = int(8, 12) + (random() < 0.5 ? 0 : 0.5);
          x[i] = level;
          break;
        case 3: // a ramp with repeats: ties between neighbours
          x[i] = Math.floor(i / int(1, 4));
          break;
        case 4: // frequencies around 10 Hz with rare phase slips and values equal in
          // the high 32 bits (the radix sort's tie runs)
          x[i] =
            random() < 0.03
              ? (random() - 0.5) * 500
              : 10 + Math.floor(random() * 64) * 2 ** -40 + (random() < 0.3 ? 0 : random());
          break;
        default: // NaN here and there
          x[i] = random() < 0.1 ? NaN : int(-5, 5);
      }
    }
    return x;
  }

  const same = (a: number, b: number): boolean => a === b || (Number.isNaN(a) && Number.isNaN(b));

  it('gives the median of every window exactly, for 300 random cases', () => {
    const ws = new RunningMedianWorkspace();
    for (let c = 0; c < 300; c++) {
      const kind = c % 6;
      const n = random() < 0.1 ? int(1, 5) : int(6, 400);
      // Odd windows up to past twice the input, where the mirroring wraps around.
      const count = int(1, 4);
      const windows = Array.from({ length: count }, () => 2 * int(0, Math.min(110, n + 2)) + 1);
      const chunkSamples = random() < 0.2 ? int(1, 8) : int(9, n + 50);
      const x = generate(kind, n);
      const outputs = windows.map(() => new Float64Array(n));
      runningMedians(x, { windowsSamples: windows, chunkSamples }, ws, outputs);
      windows.forEach((k, w) => {
        const expected = windowMedians(x, k);
        const bad = expected.findIndex((v, i) => !same(outputs[w][i], v));
        // The case is named so that a failure can be reproduced.
        expect({ case: c, kind, n, k, chunkSamples, firstDifference: bad }).toEqual({
          case: c,
          kind,
          n,
          k,
          chunkSamples,
          firstDifference: -1,
        });
      });
    }
  });

  it('fuses the median across ten windows like numpy.median of the sorted windows', () => {
    const ten = medianWindowLengths({ sampleRateHz: 500 });
    for (const kind of [0, 1, 2, 4]) {
      const n = int(300, 700);
      const x = generate(kind, n);
      const perWindow = ten.map((k) => windowMedians(x, k));
      // numpy.median of an even count: the mean of the two middle values.
      const expected = x.map((_, i) => {
        const column = Float64Array.from(perWindow, (m) => m[i]).sort();
        return (column[4] + column[5]) / 2;
      });
      const fused = medianFilterFrequency(x, ten, new FrequencySlidingWorkspace());
      expect(expected.findIndex((v, i) => fused[i] !== v)).toBe(-1);
    }
  });
});

describe('rankFloat64', () => {
  it('ranks like a stable comparison sort with NaN last, for special values of both signs', () => {
    // Generated: zeros of both signs, infinities, subnormals, NaNs with the sign bit set
    // and clear, values sharing high words, repeats.
    const bits = new DataView(new ArrayBuffer(8));
    bits.setUint32(0, 0xfff80000);
    bits.setUint32(4, 1);
    const negativeNaN = bits.getFloat64(0);
    let seed = 3;
    const random = (): number => {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      return seed / 2147483648;
    };
    const pool = [0, -0, Infinity, -Infinity, 5e-324, -5e-324, NaN, negativeNaN, 1, -1, 2.5];
    for (const n of [1, 2, 33, 500, 3000]) {
      const values = Float64Array.from({ length: n }, () => {
        const r = random();
        if (r < 0.3) return pool[Math.floor(random() * pool.length)];
        if (r < 0.6) return 3 + Math.floor(random() * 50) * 2 ** -45;
        return (random() - 0.5) * 1e6;
      });
      const rank = new Int32Array(n);
      const sorted = new Float64Array(n);
      rankFloat64(values, rank, sorted, new ArgsortWorkspace());
      const expected = Array.from(values.keys()).sort((a, b) => {
        const [x, y] = [values[a], values[b]];
        if (Number.isNaN(x) || Number.isNaN(y))
          return Number(Number.isNaN(x)) - Number(Number.isNaN(y)) || a - b;
        // −0 and +0 compare equal; the rank orders them by sign, so compare them that way.
        return x - y || Number(Object.is(y, -0)) - Number(Object.is(x, -0)) || a - b;
      });
      const expectedRank = new Array<number>(n);
      expected.forEach((i, r) => (expectedRank[i] = r));
      expect(Array.from(rank)).toEqual(expectedRank);
      expect(expected.every((i, r) => Object.is(sorted[r], values[i]))).toBe(true);
    }
  });
});
