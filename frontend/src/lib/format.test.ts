import { describe, expect, it } from 'vitest';
import {
  formatBytes,
  formatDeltaHz,
  formatDeltaHzRange,
  formatHz,
  formatHzRange,
  formatPercent,
  formatPValue,
  formatSeconds,
  formatSlopeHzPerYear,
  formatTimeFromOnsetS,
} from './format';

// Hand-written expectations from the formatting rules (shared/src/number-format.ts): U+2212
// MINUS SIGN for negatives, rounded before signing, a no-break space (U+00A0) before the unit.
const M = '\u2212';
const S = '\u00A0';

describe('screen number format', () => {
  it('writes the issue 15 cases the way the PDF does', () => {
    expect(formatHz(-0.004)).toBe(`0.00${S}Hz`);
    expect(formatDeltaHz(-0.497)).toBe(`${M}0.50${S}Hz`);
    expect(formatSlopeHzPerYear(0.001)).toBe(`0.00${S}Hz/year`);
    expect(formatSlopeHzPerYear(0.25)).toBe(`+0.25${S}Hz/year`);
    expect(formatTimeFromOnsetS(-1)).toBe(`${M}1.0${S}s`);
  });

  it('keeps the old helpers and their defaults', () => {
    expect(formatHz(10.246)).toBe(`10.25${S}Hz`);
    expect(formatHz(null)).toBe('—');
    expect(formatSeconds(-0.5)).toBe(`${M}0.5${S}s`);
    expect(formatSeconds(12.345, 2)).toBe(`12.35${S}s`);
    expect(formatPercent(12.34)).toBe(`12.3${S}%`);
    expect(formatBytes(999)).toBe(`999${S}B`);
    expect(formatBytes(1_234_567)).toBe(`1.2${S}MB`); // 1 MB = 10⁶ bytes (SI)
  });

  it('writes bands and intervals with the unit once', () => {
    expect(formatHzRange([8, 13])).toBe(`8.00 to 13.00${S}Hz`);
    expect(formatDeltaHzRange([-0.4123, 0.02])).toBe(`${M}0.41 to +0.02${S}Hz`);
    expect(formatPValue(0.00001)).toBe(`<${S}0.001`);
  });
});
