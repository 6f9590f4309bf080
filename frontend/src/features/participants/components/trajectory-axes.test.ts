import type { TrajectoryView, TrajectoryVisitView } from '@gyre/shared';
import { describe, expect, it } from 'vitest';
import { alphaFrequencySpec, onsetChangeSpec } from './trajectory-spec';

const M = '\u2212';
const distinct = (labels: string[] | undefined) => new Set(labels).size === labels?.length;

describe('trajectory chart axes', () => {
  it('trajectory: November 2026 named once, Δf axis covers zero', () => {
    const visit = (date: string, pafHz: number, deltaFHz: number): TrajectoryVisitView =>
      ({
        visitId: date,
        label: date,
        date,
        pafHz,
        cogHz: pafHz + 0.1,
        deltaFHz,
        pafChangeHz: null,
        cogChangeHz: null,
        deltaFChangeHz: null,
        flagged: false,
        doubts: [],
      }) as unknown as TrajectoryVisitView;
    const trend = { slopeHzPerYear: null, reason: 'too-few-visits', visits: 4, spanDays: 21 };
    const trajectory = {
      participantId: 'p',
      visits: [
        visit('2026-11-02', 10.1, -0.2),
        visit('2026-11-09', 10.0, -0.3),
        visit('2026-11-16', 9.9, -0.25),
        visit('2026-11-23', 9.95, -0.1),
      ],
      trendRule: { minVisits: 3, minSpanDays: 180 },
      trends: { paf: trend, cog: trend, deltaF: trend },
      slopesHzPerYear: { paf: null, cog: null, deltaF: null },
    } as unknown as TrajectoryView;
    for (const widthPx of [360, 640, 1200]) {
      const alpha = alphaFrequencySpec(trajectory, { widthPx, heightPx: 280 });
      const x = alpha.axisLabels?.x ?? [];
      expect(distinct(x)).toBe(true);
      expect(x.filter((l) => l.includes('2026'))).toHaveLength(1);
      expect(distinct(alpha.axisLabels?.y)).toBe(true);
    }
    const onset = onsetChangeSpec(trajectory);
    // −0.3 to −0.1 Hz and the zero line: hand-counted step 0.05, so 0 reads "0.00".
    expect(onset.axisLabels?.y).toContain('0.00');
    expect(onset.axisLabels?.y?.[0]).toBe(`${M}0.30`);
    expect(onset.axisLabels?.y?.some((l) => l.startsWith('-'))).toBe(false);
  });
});
