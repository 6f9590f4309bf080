import { describe, expect, it } from 'vitest';
import { MS_PER_YEAR, theilSenLine } from './theil-sen-line';

describe('theilSenLine', () => {
  it('puts the line where scipy.stats.theilslopes puts it', () => {
    // Generated test data: visits at 0, 0.5, 1 and 2 years with PAF in Hz. Reference:
    // scipy 1.17 `theilslopes([10.2, 10.1, 9.4, 9.9], [0, 0.5, 1, 2])` gives slope −0.175
    // and intercept 10.13125 (computed with Debian's python3-scipy).
    const origin = Date.UTC(2024, 0, 10);
    const points = [0, 0.5, 1, 2].map((years, i) => ({
      timeMs: origin + years * MS_PER_YEAR,
      valueHz: [10.2, 10.1, 9.4, 9.9][i],
    }));
    const line = theilSenLine(points, -0.175);
    expect(line).not.toBeNull();
    const [start, end] = line!;
    expect(start.timeMs).toBe(origin);
    expect(start.valueHz).toBeCloseTo(10.13125, 10);
    expect(end.timeMs).toBeCloseTo(origin + 2 * MS_PER_YEAR, 3);
    expect(end.valueHz).toBeCloseTo(10.13125 - 2 * 0.175, 10);
  });

  it('draws nothing without a slope or with a single visit', () => {
    const one = [{ timeMs: 0, valueHz: 10 }];
    expect(theilSenLine(one, -0.1)).toBeNull();
    expect(theilSenLine([...one, { timeMs: MS_PER_YEAR, valueHz: 9 }], null)).toBeNull();
  });
});
