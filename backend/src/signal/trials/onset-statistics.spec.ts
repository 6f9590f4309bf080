import { onsetCurve, OnsetCurveScratch } from './onset-statistics';
import { seededUniform } from '../random/random';

describe('onsetCurve', () => {
  const curveOf = (scratch?: OnsetCurveScratch): ReturnType<typeof onsetCurve> =>
    onsetCurve(
      // Three trials of four points, bins of two points (maxPoints 2).
      Float64Array.from([9, 11, 12, 12, 10, 12, 12, 12, 11, 13, 12, 13]),
      {
        points: 4,
        trials: [0, 1, 2],
        epochWindowS: [-0.02, 0.01],
        sampleRateHz: 100,
        maxPoints: 2,
      },
      scratch,
    );

  it('gives mean ∓ 1.96·SD/√n per bin: a hand-computed case', () => {
    // Bin means per trial: [10, 12], [11, 12], [12, 12.5]; over trials: means 11 and 36.5/3,
    // sample SDs 1 and √(1/12) (n − 1 = 2), so half-widths 1.96·SD/√3.
    const curve = curveOf();
    expect(Array.from(curve.meanHz)).toEqual([11, 36.5 / 3]);
    expect(curve.upperHz[0] - curve.meanHz[0]).toBeCloseTo(1.96 / Math.sqrt(3), 12);
    expect(curve.upperHz[1] - curve.meanHz[1]).toBeCloseTo(
      (1.96 * Math.sqrt(1 / 12)) / Math.sqrt(3),
      12,
    );
    expect(Array.from(curve.raster)).toEqual([10, 12, 11, 12, 12, 12.5]);
    // Bin centres: −0.02 s + 0.5 and 2.5 samples at 100 Hz.
    expect(curve.timesS[0]).toBeCloseTo(-0.015, 15);
    expect(curve.timesS[1]).toBeCloseTo(0.005, 15);
  });

  it('gives the same bits with a scratch reused from call to call', () => {
    const random = seededUniform(3);
    const points = 1001;
    const epochs = Float64Array.from({ length: 60 * points }, () => 8 + 4 * random());
    const trials = Array.from({ length: 60 }, (_, k) => k).filter((k) => k % 7 !== 3);
    const options = { points, trials, epochWindowS: [-1, 1] as const, sampleRateHz: 500 };
    const scratch = new OnsetCurveScratch();
    // A larger call first leaves other values in the scratch's buffers.
    onsetCurve(
      Float64Array.from({ length: 70 * points }, () => random()),
      {
        ...options,
        trials: Array.from({ length: 70 }, (_, k) => k),
      },
      scratch,
    );
    const reused = onsetCurve(epochs, options, scratch);
    const fresh = onsetCurve(epochs, options);
    for (const key of ['meanHz', 'lowerHz', 'upperHz', 'timesS', 'raster'] as const) {
      expect(Array.from(reused[key])).toEqual(Array.from(fresh[key]));
    }
    // 1001 points in at most 500 bins (the default): 3 points per bin, 334 bins; trial 0's
    // first bin is the mean of its first three points.
    expect(fresh.raster).toHaveLength(trials.length * 334);
    expect(fresh.raster[0]).toBe(Math.fround((epochs[0] + epochs[1] + epochs[2]) / 3));
    expect(curveOf(scratch).raster.buffer).toBe(reused.raster.buffer);
  });
});
