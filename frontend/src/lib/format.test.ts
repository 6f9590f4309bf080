import { describe, expect, it } from 'vitest';
import {
  formatCount,
  formatAfterFirstUpload,
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

describe('counts with their noun', () => {
  it('is singular for exactly one, plural otherwise, with the grouped number (common practice)', () => {
    expect(formatCount(1, 'row')).toBe('1 row');
    expect(formatCount(0, 'row')).toBe('0 rows');
    expect(formatCount(2, 'quality warning')).toBe('2 quality warnings');
    expect(formatCount(1, 'entry', 'entries')).toBe('1 entry');
    expect(formatCount(12, 'entry', 'entries')).toBe('12 entries');
    expect(formatCount(1204, 'file')).toMatch(/^1\D?204 files$/);
  });
});

describe('times of a blinded visit, from its first upload', () => {
  // The server sends the distance from the first upload as an instant counted from
  // 1970-01-01T00:00:00Z (backend blinded-visit-facts.ts); boundaries by hand: 1 s = 1000 ms,
  // 1 min = 60 s, 1 h = 60 min, 1 d = 24 h.
  const after = (ms: number) => formatAfterFirstUpload(new Date(ms).toISOString());
  const SEC = 1000;
  const MIN = 60 * SEC;
  const HOUR = 60 * MIN;
  const DAY = 24 * HOUR;

  it('says "at first upload" for the upload itself and anything under a second', () => {
    expect(formatAfterFirstUpload('1970-01-01T00:00:00.000Z')).toBe('at first upload');
    expect(after(999)).toBe('at first upload');
  });

  it('counts whole seconds under a minute, whole minutes under an hour', () => {
    expect(after(SEC)).toBe(`+1${S}s after first upload`);
    expect(after(MIN - 1)).toBe(`+59${S}s after first upload`);
    expect(after(MIN)).toBe(`+1${S}min after first upload`);
    expect(after(12 * MIN + 59 * SEC)).toBe(`+12${S}min after first upload`);
    expect(after(HOUR - 1)).toBe(`+59${S}min after first upload`);
  });

  it('gives hours with minutes under a day, days with hours beyond, a zero second unit left out', () => {
    expect(after(HOUR)).toBe(`+1${S}h after first upload`);
    expect(after(2 * HOUR + 5 * MIN)).toBe(`+2${S}h 5${S}min after first upload`);
    expect(after(DAY - 1)).toBe(`+23${S}h 59${S}min after first upload`);
    expect(after(DAY)).toBe(`+1${S}d after first upload`);
    expect(after(3 * DAY + 4 * HOUR + 59 * MIN)).toBe(`+3${S}d 4${S}h after first upload`);
    expect(after(400 * DAY)).toBe(`+400${S}d after first upload`);
  });

  it('never writes a date, and nothing for no time', () => {
    for (const ms of [0, SEC, MIN, HOUR, DAY, 40 * DAY]) expect(after(ms)).not.toMatch(/1970|Jan/);
    expect(formatAfterFirstUpload(null)).toBe('—');
    expect(formatAfterFirstUpload('not a time')).toBe('—');
  });
});
