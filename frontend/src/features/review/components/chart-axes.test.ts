import { describe, expect, it } from 'vitest';
import { onsetCurveSpec, type OnsetCurvePoint } from './onset-curve-spec';
import { restSpectrumSpec } from './rest-spectrum-spec';

const M = '\u2212';
const distinct = (labels: string[] | undefined) => new Set(labels).size === labels?.length;

/** Generated test data: a curve from −1 to 2 s every 0.01 s, mean 9.8–10.1 Hz (issue 15). */
function issueCurve(): OnsetCurvePoint[] {
  return Array.from({ length: 301 }, (_, i) => {
    const t = -1 + i / 100;
    const mean = 9.95 + 0.15 * Math.sin(t * 2);
    return { timeS: t, meanHz: mean, ciLowHz: mean - 0.01, ciHighHz: mean + 0.01 };
  });
}

describe('review chart axes', () => {
  it('onset curve at 390 px: −1.0 labelled, distinct labels, onset named above the plot', () => {
    const spec = onsetCurveSpec({
      points: issueCurve(),
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.2, 0.8],
      seriesName: 'Mean',
      widthPx: 390 - 48,
      heightPx: 300,
    });
    const x = spec.axisLabels?.x ?? [];
    expect(x[0]).toBe(`${M}1.0`);
    expect(x[x.length - 1]).toBe('+2.0');
    expect(distinct(x)).toBe(true);
    expect(distinct(spec.axisLabels?.y)).toBe(true);
    expect(spec.scale?.x).toMatchObject({ domain: [-1, 2], nice: false });
    // The windows are named in the key beside the chart, not inside the plot.
    expect(spec.children.find((m) => m.type === 'rangeX')?.labels).toBeUndefined();
    // "Onset" sits in the margin above the plot area, where the curve never goes.
    const onset = spec.children.find((m) => m.type === 'lineX');
    expect(onset?.labels?.[0]).toMatchObject({
      text: 'Onset',
      position: 'top',
      textBaseline: 'bottom',
    });
    expect(spec.marginTop).toBeGreaterThanOrEqual(16);
  });

  it('rest spectrum: power ticks in one notation (issue 15 had 500, 90, 40, 8, 3, 0.7, 0.2)', () => {
    const points = [1, 2, 5, 10, 20, 40].map((f, i) => ({
      frequencyHz: f,
      powerUv2PerHz: [500, 90, 8, 40, 0.7, 0.2][i],
    }));
    const spec = restSpectrumSpec({ points, alphaWindowHz: [7, 13], pafHz: 10, cogHz: 10.2 });
    // Hand-counted: 0.2–500 spans the decades 0.1–1000; powers of ten in plain decimals.
    expect(spec.axisLabels?.y).toEqual(['0.1', '1', '10', '100', '1000']);
    expect(distinct(spec.axisLabels?.x)).toBe(true);
    expect(spec.axis?.y).toMatchObject({ title: 'Power (log scale) (µV²/Hz)' });
  });
});
