import {
  formatCiHz,
  formatDeltaHz,
  formatHz,
  formatNumber,
  formatPercent,
  formatSeconds,
} from './report-numbers';

const MINUS = '\u2212';

describe('report numbers', () => {
  it('writes negatives with the true minus sign (U+2212), never a hyphen-minus', () => {
    expect(formatDeltaHz(-0.2871)).toBe(`${MINUS}0.287 Hz`);
    expect(formatCiHz([-0.4123, -0.1502])).toBe(`${MINUS}0.412 to ${MINUS}0.150 Hz`);
    expect(formatHz(-1.5)).toBe(`${MINUS}1.50 Hz`);
    expect(formatSeconds(-0.5)).toBe(`${MINUS}0.5 s`);
    expect(formatNumber(-3.25, 1)).toBe(`${MINUS}3.3`);
    expect(formatPercent(-0.125)).toBe(`${MINUS}12.5 %`);
  });

  it('shows the sign of a change always, so slowing and speeding read apart', () => {
    expect(formatDeltaHz(0.0512)).toBe('+0.051 Hz');
    expect(formatCiHz([-0.01, 0.02])).toBe(`${MINUS}0.010 to +0.020 Hz`);
  });

  it('rounds first and then signs: a value that rounds to zero has no sign', () => {
    expect(formatDeltaHz(-0.0004)).toBe('0.000 Hz');
    expect(formatCiHz([-0.0002, 0.0003])).toBe('0.000 to 0.000 Hz');
    expect(formatHz(-0.004)).toBe('0.00 Hz');
    expect(formatNumber(-0.04, 1)).toBe('0.0');
    expect(formatPercent(-0.00001)).toBe('0.0 %');
    expect(formatSeconds(-0)).toBe('0.0 s');
  });

  it('keeps the sign of a value that does not round to zero', () => {
    expect(formatDeltaHz(-0.0006)).toBe(`${MINUS}0.001 Hz`);
    expect(formatHz(-0.006)).toBe(`${MINUS}0.01 Hz`);
  });
});
