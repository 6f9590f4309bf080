import {
  frequencySliding,
  frequencySlidingInWorkspace,
  FrequencySlidingWorkspace,
} from './frequency-sliding';

describe('frequencySlidingInWorkspace', () => {
  // Generated: FM tones f(t) = f0 + sin(2π·0.5·t) Hz plus a small second tone, so the raw
  // frequency varies and the median filter has work to do (Boashash 1992 for f(t)).
  function tone(seconds: number, fs: number, f0: number): Float64Array {
    return Float64Array.from({ length: seconds * fs }, (_, i) => {
      const t = i / fs;
      return (
        20 * Math.cos(2 * Math.PI * f0 * t - 2 * Math.cos(Math.PI * t)) +
        3 * Math.sin(2 * Math.PI * 23 * t)
      );
    });
  }

  it('gives frequencySliding’s values to the bit, channel after channel in one workspace', () => {
    const fs = 250;
    const options = { sampleRateHz: fs, bandHz: [8, 13] as const };
    const workspace = new FrequencySlidingWorkspace();
    let previous: Float64Array | null = null;
    // Longer, shorter, then longer again: the views shrink and grow over the same buffers.
    for (const [seconds, f0] of [
      [30, 10],
      [12, 9.5],
      [30, 11],
    ]) {
      const x = tone(seconds, fs, f0);
      const expected = frequencySliding(x, options);
      const result = frequencySlidingInWorkspace(x, options, workspace);
      expect(result.frequencyHz).toHaveLength(x.length - 1);
      expect(result.frequencyHz).toEqual(expected.frequencyHz);
      expect(result.rawFrequencyHz).toEqual(expected.rawFrequencyHz);
      expect(result.outOfBandShare).toBe(expected.outOfBandShare);
      // Away from the edges the filtered frequency follows f0 ± 1 Hz (Boashash 1992).
      const middle = result.frequencyHz.subarray(3 * fs, x.length - 3 * fs);
      expect(Math.min(...middle)).toBeGreaterThan(f0 - 1.1);
      expect(Math.max(...middle)).toBeLessThan(f0 + 1.1);
      if (previous) expect(result.frequencyHz.buffer).toBe(previous.buffer);
      previous = result.frequencyHz;
    }
  });
});
