import {
  formatCiHz,
  formatDeltaHz,
  formatHz,
  formatNumber,
  formatPercent,
  formatPValue,
  formatSeconds,
  formatSlopeHzPerYear,
} from './report-numbers';

// Expected strings written by hand from the rules (shared/src/number-format.ts): U+2212
// MINUS SIGN (Unicode), rounded before signing, no-break space U+00A0 before the unit.
const M = '\u2212';
const S = '\u00A0';

describe('report numbers', () => {
  it('writes negatives with the true minus sign (U+2212), never a hyphen-minus', () => {
    expect(formatDeltaHz(-0.2871)).toBe(`${M}0.29${S}Hz`);
    expect(formatCiHz([-0.4123, -0.1502])).toBe(`${M}0.41 to ${M}0.15${S}Hz`);
    expect(formatHz(-1.5)).toBe(`${M}1.50${S}Hz`);
    expect(formatSeconds(-0.5)).toBe(`${M}0.5${S}s`);
    expect(formatNumber(-3.25, 1)).toBe(`${M}3.3`);
    expect(formatPercent(-0.125)).toBe(`${M}12.5${S}%`);
  });

  it('has the screen precision: Δf to 0.01 Hz (issue 15: −0.497 read −0.50 on screen)', () => {
    expect(formatDeltaHz(-0.497)).toBe(`${M}0.50${S}Hz`);
    expect(formatSlopeHzPerYear(0.126)).toBe(`+0.13${S}Hz/year`);
  });

  it('shows the sign of a change always, so slowing and speeding read apart', () => {
    expect(formatDeltaHz(0.0512)).toBe(`+0.05${S}Hz`);
    expect(formatCiHz([-0.01, 0.02])).toBe(`${M}0.01 to +0.02${S}Hz`);
  });

  it('rounds first and then signs: a value that rounds to zero has no sign', () => {
    expect(formatDeltaHz(-0.004)).toBe(`0.00${S}Hz`);
    expect(formatSlopeHzPerYear(0.001)).toBe(`0.00${S}Hz/year`);
    expect(formatCiHz([-0.002, 0.003])).toBe(`0.00 to 0.00${S}Hz`);
    expect(formatHz(-0.004)).toBe(`0.00${S}Hz`);
    expect(formatNumber(-0.04, 1)).toBe('0.0');
    expect(formatPercent(-0.00001)).toBe(`0.0${S}%`);
    expect(formatSeconds(-0)).toBe(`0.0${S}s`);
  });

  it('keeps the sign of a value that does not round to zero', () => {
    expect(formatDeltaHz(-0.006)).toBe(`${M}0.01${S}Hz`);
    expect(formatHz(-0.006)).toBe(`${M}0.01${S}Hz`);
  });

  it('writes p as < 0.001 or to three decimals', () => {
    expect(formatPValue(0.0002)).toBe(`<${S}0.001`);
    expect(formatPValue(0.0123)).toBe('0.012');
  });
});
