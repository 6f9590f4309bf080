import type { TrajectoryDto, TrajectoryVisitDto } from '@gyre/shared';
import { render, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import {
  onsetCurveSpec,
  type OnsetCurvePoint,
} from '../../features/review/components/onset-curve-spec';
import { restSpectrumSpec } from '../../features/review/components/rest-spectrum-spec';
import {
  alphaFrequencySpec,
  onsetChangeSpec,
} from '../../features/participants/components/trajectory-spec';
import { PlotFigure } from './plot-figure';
import type { PlotSpec } from './plot-spec';

vi.mock('./g2-plot', () => import('./testing/fake-g2-plot'));

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

describe('chart axes on screen', () => {
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

  it('trajectory: November 2026 named once, Δf axis covers zero', () => {
    const visit = (date: string, pafHz: number, deltaFHz: number): TrajectoryVisitDto =>
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
      }) as unknown as TrajectoryVisitDto;
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
    } as unknown as TrajectoryDto;
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

  it('the figure hands its tick labels to the page and never sets a fixed width', () => {
    const spec = (widthPx: number): PlotSpec => ({
      type: 'view',
      children: [],
      axisLabels: { x: [`w${widthPx}`], y: ['1', '2'] },
    });
    render(<PlotFigure label="Test chart" spec={spec} heightPx={200} />);
    const frame = screen.getByRole('figure', { name: 'Test chart' })
      .firstElementChild as HTMLElement;
    // jsdom measures no width: the default 640 px is used.
    expect(JSON.parse(frame.dataset.xTicks ?? '[]')).toEqual(['w640']);
    expect(JSON.parse(frame.dataset.yTicks ?? '[]')).toEqual(['1', '2']);
    expect(frame.style.width).toBe('100%');
  });
});
