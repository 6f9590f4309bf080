import { describe, expect, it } from 'vitest';
import { changedFields } from './entry-diff';

// Expected strings are written out here by hand: U+2212 is the true minus sign and U+00A0 the
// no-break space before a unit (the Unicode Standard, ch. 6 and 22; docs of lib/format.ts).
const NBSP = '\u00a0';
const MINUS = '\u2212';

describe('changedFields', () => {
  it('lists only changed settings, with labels and units', () => {
    const rows = changedFields(
      { version: 3, bandHz: [8, 13], method: 'filter', flagThresholdHz: -0.2 },
      { version: 4, bandHz: [7, 13], method: 'filter', flagThresholdHz: -0.3 },
    );
    expect(rows).toEqual([
      { path: 'version', label: 'Settings version', before: '3', after: '4' },
      {
        path: 'bandHz',
        label: 'Band',
        before: `8.00–13.00${NBSP}Hz`,
        after: `7.00–13.00${NBSP}Hz`,
      },
      {
        path: 'flagThresholdHz',
        label: 'Flag threshold',
        before: `${MINUS}0.20${NBSP}Hz`,
        after: `${MINUS}0.30${NBSP}Hz`,
      },
    ]);
  });

  it('writes an absent value as one dash, whether it was missing or null', () => {
    const rows = changedFields(null, {
      state: 'raised',
      raiseReason: 'ROI slowing',
      clearReason: null,
    });
    expect(rows).toEqual([
      { path: 'state', label: 'State', before: '—', after: 'raised' },
      { path: 'raiseReason', label: 'Reason for raising', before: '—', after: 'ROI slowing' },
    ]);
    // undefined → null is no change at all.
    expect(changedFields({ onsetLabel: undefined }, { onsetLabel: null })).toEqual([]);
    expect(changedFields(null, null)).toEqual([]);
  });

  it('shows user ids as names, and bookkeeping (ids, write stamps) not at all', () => {
    const rows = changedFields(
      { state: 'raised', clearedById: null, updatedAt: '2026-01-01T00:00:00Z', id: 'f1' },
      { state: 'cleared', clearedById: 'u-1', updatedAt: '2026-01-02T00:00:00Z', id: 'f1' },
      { 'u-1': 'Ana Lyst' },
    );
    expect(rows.map((r) => [r.label, r.before, r.after])).toEqual([
      ['State', 'raised', 'cleared'],
      ['Cleared by', '—', 'Ana Lyst'],
    ]);
    // A user the reader may not read stays an id, shortened, never a guess.
    expect(changedFields({}, { raisedById: 'abcdef1234567890' })[0].after).toBe('user abcdef12');
  });

  it('rounds floating-point noise through the shared formatter and flattens nested objects', () => {
    const rows = changedFields(
      { ratio: 0.1 + 0.2, revision: { revision: 1, state: 'draft' } },
      { ratio: -0.000001, revision: { revision: 2, state: 'signed' } },
    );
    expect(rows).toEqual([
      // 0.1 + 0.2 = 0.30000000000000004 in IEEE 754 binary64; four significant digits.
      { path: 'ratio', label: 'Ratio', before: '0.3000', after: `${MINUS}0.000001000` },
      { path: 'revision.revision', label: 'Revision › Revision', before: '1', after: '2' },
      { path: 'revision.state', label: 'Revision › State', before: 'draft', after: 'signed' },
    ]);
  });

  it('gives time windows in seconds from onset with signs', () => {
    const [row] = changedFields({ baselineWindowS: [-0.5, 0] }, { baselineWindowS: [-0.4, 0] });
    expect(row.label).toBe('Baseline window');
    expect(row.before).toBe(`${MINUS}0.5 to 0.0${NBSP}s`);
    expect(row.after).toBe(`${MINUS}0.4 to 0.0${NBSP}s`);
  });
});
