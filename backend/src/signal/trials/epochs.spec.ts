import { cutFrequencyEpochs, epochPointCount } from './epochs';

// The reference is the definition written out point by point (docs/method.md §3): point i of
// an epoch is series value round((onset + epochStart − firstTime)·fs) + i, NaN outside it.
describe('cutFrequencyEpochs', () => {
  const fs = 100;
  const series = Float64Array.from({ length: 1000 }, (_, j) => 8 + j / 1000);
  const options = {
    sampleRateHz: fs,
    firstTimeS: 0.5 / fs,
    // Inside, sticking out at the start, at the end, and wholly outside on both sides.
    onsetsS: [3, 0.2, 9.9, -5, 20, 5.004],
    epochWindowS: [-0.5, 1] as const,
  };

  function byDefinition(): number[] {
    const points = epochPointCount(options.epochWindowS, fs);
    return options.onsetsS.flatMap((t) => {
      const j0 = Math.round((t + options.epochWindowS[0] - options.firstTimeS) * fs);
      return Array.from({ length: points }, (_, i) =>
        j0 + i >= 0 && j0 + i < series.length ? series[j0 + i] : NaN,
      );
    });
  }

  it('takes the nearest value per point and NaN outside the series', () => {
    const epochs = cutFrequencyEpochs(series, options);
    expect(epochs).toHaveLength(options.onsetsS.length * 151);
    expect(Array.from(epochs)).toEqual(byDefinition());
    // Hand check: onset 3 s, epoch from 2.5 s: value round((2.5 − 0.005)·100) = 250 (rounded up).
    expect(epochs[0]).toBe(series[250]);
    expect(Number.isNaN(epochs[151])).toBe(true); // 0.2 − 0.5 s lies before the recording
  });

  it('writes into a reused buffer, overwriting what it held', () => {
    const output = new Float64Array(options.onsetsS.length * 151).fill(-1);
    expect(cutFrequencyEpochs(series, options, output)).toBe(output);
    expect(Array.from(output)).toEqual(byDefinition());
    // An onset that is not a number leaves its own row NaN and no other.
    const odd = { ...options, onsetsS: [3, Number.NaN, 5] };
    const three = cutFrequencyEpochs(series, odd, new Float64Array(3 * 151).fill(-1));
    expect(Array.from(three.subarray(0, 151))).toEqual(byDefinition().slice(0, 151));
    expect(three.subarray(151, 302).every((v) => Number.isNaN(v))).toBe(true);
    expect(three[302]).toBe(series[450]);
    expect(() => cutFrequencyEpochs(series, options, new Float64Array(3))).toThrow(
      /output: expected length 906, got 3/,
    );
  });
});
