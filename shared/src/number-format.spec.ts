import {
  formatDeltaHz,
  formatHz,
  formatNumber,
  formatPValue,
  formatQuantity,
  formatQuantityRange,
  formatShareAsPercent,
  formatSignificant,
  formatSlopeHzPerYear,
  MINUS_SIGN,
  NO_VALUE,
  QUANTITIES,
  UNIT_SPACE,
} from './number-format';

// Expected strings are written out by hand from the rules in number-format.ts: U+2212 for
// negatives (Unicode 15, "MINUS SIGN"), rounded before signing, unit after U+00A0.
const M = MINUS_SIGN;
const S = UNIT_SPACE;

describe('number format', () => {
  it('uses U+2212 and U+00A0, never a hyphen-minus or a plain space', () => {
    expect(MINUS_SIGN.codePointAt(0)).toBe(0x2212);
    expect(UNIT_SPACE.codePointAt(0)).toBe(0xa0);
    expect(formatHz(-0.497)).toBe(`${M}0.50${S}Hz`);
    expect(formatHz(-0.497)).not.toMatch(/[-\u0020]/);
  });

  it('prints what rounds to zero as 0.00 with no sign (issue 15 cases)', () => {
    expect(formatHz(-0.004)).toBe(`0.00${S}Hz`);
    expect(formatDeltaHz(-0.004)).toBe(`0.00${S}Hz`);
    expect(formatDeltaHz(0.004)).toBe(`0.00${S}Hz`);
    expect(formatSlopeHzPerYear(0.0049)).toBe(`0.00${S}Hz/year`);
    expect(formatSlopeHzPerYear(-0)).toBe(`0.00${S}Hz/year`);
    expect(formatNumber(-0.04, 1)).toBe('0.0');
    expect(formatShareAsPercent(-0.0000001)).toBe(`0.0${S}%`);
  });

  it('keeps the sign of a value that does not round to zero', () => {
    expect(formatDeltaHz(-0.005)).toBe(`${M}0.01${S}Hz`); // |−0.005|.toFixed(2) = "0.01"
    expect(formatDeltaHz(-0.497)).toBe(`${M}0.50${S}Hz`);
    expect(formatDeltaHz(0.0512)).toBe(`+0.05${S}Hz`);
    expect(formatSlopeHzPerYear(0.126)).toBe(`+0.13${S}Hz/year`);
    expect(formatSlopeHzPerYear(-1.2)).toBe(`${M}1.20${S}Hz/year`);
    expect(formatQuantity(-1, 'timeFromOnsetS')).toBe(`${M}1.0${S}s`);
    expect(formatQuantity(2, 'timeFromOnsetS')).toBe(`+2.0${S}s`);
    expect(formatQuantity(0, 'timeFromOnsetS')).toBe(`0.0${S}s`);
  });

  it('writes unsigned quantities without a plus', () => {
    expect(formatHz(10.246)).toBe(`10.25${S}Hz`);
    expect(formatQuantity(12.34, 'durationS')).toBe(`12.3${S}s`);
    expect(formatShareAsPercent(0.125)).toBe(`12.5${S}%`);
  });

  it('writes one range with its unit once', () => {
    expect(formatQuantityRange([-0.4123, -0.1502], 'deltaFHz')).toBe(`${M}0.41 to ${M}0.15${S}Hz`);
    expect(formatQuantityRange([-0.01, 0.02], 'deltaFHz')).toBe(`${M}0.01 to +0.02${S}Hz`);
    expect(formatQuantityRange([8, 13], 'frequencyHz')).toBe(`8.00 to 13.00${S}Hz`);
    expect(formatQuantityRange(null, 'frequencyHz')).toBe(NO_VALUE);
  });

  it('writes powers to three significant digits in plain decimals', () => {
    expect(formatQuantity(0.000123456, 'powerUv2PerHz')).toBe(`0.000123${S}µV²/Hz`);
    expect(formatQuantity(45678, 'powerUv2PerHz')).toBe(`45700${S}µV²/Hz`);
    expect(formatQuantity(999.6, 'powerUv2PerHz')).toBe(`1000${S}µV²/Hz`);
    expect(formatSignificant(-2.5e-3, 2)).toBe(`${M}0.0025`);
    expect(formatSignificant(0, 3)).toBe('0');
  });

  it('writes p values to three decimals, below 0.001 as < 0.001', () => {
    expect(formatPValue(0.0004)).toBe('<\u00A00.001');
    expect(formatPValue(0.001)).toBe('0.001');
    expect(formatPValue(0.0456)).toBe('0.046');
  });

  it('reads missing and non-finite values as a dash', () => {
    for (const value of [null, undefined, Number.NaN, Infinity]) {
      expect(formatHz(value)).toBe(NO_VALUE);
      expect(formatPValue(value)).toBe(NO_VALUE);
    }
    expect(formatNumber(Number.NaN, 2)).toBe(NO_VALUE);
  });

  it('gives every quantity a unit and one precision', () => {
    for (const [name, format] of Object.entries(QUANTITIES)) {
      expect(`${name}:${format.unit}`).toMatch(/:\S+/);
      const f = format as { decimals?: number; significant?: number };
      expect((f.decimals === undefined) !== (f.significant === undefined)).toBe(true);
    }
  });
});
