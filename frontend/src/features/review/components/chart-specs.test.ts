import { describe, expect, it } from 'vitest';
import { onsetCurvePoints, onsetCurveSpec } from './onset-curve-spec';
import { restSpectrumSpec, spectrumPoints } from './rest-spectrum-spec';
import { rasterMatrix } from './trial-raster';

describe('onset curve spec', () => {
  // Generated test data: three points, the first without a mean.
  const curve = {
    name: 'ROI',
    meanHz: [null, 10, 9.6],
    ciLowHz: [null, 9.8, null],
    ciHighHz: [null, 10.2, null],
  };
  const points = onsetCurvePoints([-1, 0, 1], curve);

  it('leaves out points without a mean and keeps the band only where both edges exist', () => {
    expect(points.map((p) => p.timeS)).toEqual([0, 1]);
    const spec = onsetCurveSpec({
      points,
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.2, 0.8],
      seriesName: 'Mean',
    });
    const area = spec.children.find((m) => m.type === 'area');
    expect(area?.data).toEqual([{ timeS: 0, meanHz: 10, ciLowHz: 9.8, ciHighHz: 10.2 }]);
  });

  it('shades both windows, marks onset at 0 s and labels both axes with units', () => {
    const spec = onsetCurveSpec({
      points,
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.2, 0.8],
      seriesName: 'Mean',
    });
    expect(spec.children.find((m) => m.type === 'rangeX')?.data).toEqual([
      { start: -0.5, end: 0, window: 'Baseline' },
      { start: 0.2, end: 0.8, window: 'Post' },
    ]);
    expect(spec.children.find((m) => m.type === 'lineX')?.data).toEqual([0]);
    expect(spec.axis?.x).toMatchObject({ title: 'Time from onset (s)' });
    expect(spec.axis?.y).toMatchObject({ title: 'Mean instantaneous frequency (Hz)' });
  });
});

describe('rest spectrum spec', () => {
  const points = spectrumPoints([0, 0.5, 10, 45], [5, 0, 3, 1]);

  it('keeps 1–40 Hz with positive power only, for the logarithmic axis', () => {
    expect(points).toEqual([{ frequencyHz: 10, powerUv2PerHz: 3 }]);
  });

  it('marks PAF and CoG, or says "No clear peak" when there is no PAF', () => {
    const withPeak = restSpectrumSpec({ points, alphaWindowHz: [7, 13], pafHz: 10.2, cogHz: 10.1 });
    expect(withPeak.children.filter((m) => m.type === 'lineX').map((m) => m.data)).toEqual([
      [10.2],
      [10.1],
    ]);
    expect(withPeak.scale?.y).toMatchObject({ type: 'log' });
    expect(withPeak.axis?.y).toMatchObject({ title: 'Power (log scale) (µV²/Hz)' });
    const noPeak = restSpectrumSpec({ points, alphaWindowHz: [7, 13], pafHz: null, cogHz: 10.1 });
    expect(noPeak.children.filter((m) => m.type === 'lineX')).toHaveLength(1);
    expect(noPeak.children.find((m) => m.type === 'text')?.data).toEqual([
      { frequencyHz: 10, powerUv2PerHz: 3, text: 'No clear peak' },
    ]);
  });
});

describe('raster matrix', () => {
  it('reads the rows of the flat raster and turns missing cells into NaN', () => {
    const matrix = rasterMatrix({
      timeS: [-1, 0, 1],
      trialOnsetsS: [5, 9],
      trialDeltaFHz: [-0.2, null],
      trials: 2,
      points: 3,
      valuesHz: [9, 10, 11, null, 12, null],
    });
    expect(matrix.rows).toBe(2);
    expect(matrix.columns).toBe(3);
    expect(matrix.xRange).toEqual([-1, 1]);
    expect(Array.from(matrix.values)).toEqual([9, 10, 11, Number.NaN, 12, Number.NaN]);
  });

  it('refuses a raster whose values do not fill trials × points, instead of drawing it shifted', () => {
    expect(() =>
      rasterMatrix({
        timeS: [-1, 0, 1],
        trialOnsetsS: [5, 9],
        trialDeltaFHz: [-0.2, null],
        trials: 2,
        points: 3,
        valuesHz: [9, 10, 11, null, 12],
      }),
    ).toThrow('The raster holds 5 values, expected 2 × 3.');
  });
});
