import { describe, expect, it } from 'vitest';
import { CHART_PALETTE } from '../../app/theme';
import { MISSING_CELL_RGB, rampRgb } from './frequency-colour-scale';

const rgbOf = (hex: string) => [1, 3, 5].map((i) => Number.parseInt(hex.slice(i, i + 2), 16));

describe('frequency colour ramp', () => {
  it('runs from the palette teal at the low edge to the palette amber at the high edge', () => {
    expect(rampRgb(8, [8, 13])).toEqual(rgbOf(CHART_PALETTE[0]));
    expect(rampRgb(13, [8, 13])).toEqual(rgbOf(CHART_PALETTE[1]));
    // Values outside the band are clamped to its ends, not wrapped or dropped.
    expect(rampRgb(2, [8, 13])).toEqual(rgbOf(CHART_PALETTE[0]));
    expect(rampRgb(40, [8, 13])).toEqual(rgbOf(CHART_PALETTE[1]));
  });

  it('interpolates linearly between stops', () => {
    // Four stops over [0, 3]: 0.5 lies halfway between the first two (teal and sage).
    const [a, b] = [rgbOf(CHART_PALETTE[0]), rgbOf(CHART_PALETTE[2])];
    expect(rampRgb(0.5, [0, 3])).toEqual(a.map((v, i) => Math.round((v + b[i]) / 2)));
  });

  it('gives missing cells their own grey', () => {
    expect(rampRgb(Number.NaN, [8, 13])).toEqual([...MISSING_CELL_RGB]);
  });
});
