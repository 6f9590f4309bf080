import { render, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { PlotFigure } from './plot-figure';
import type { PlotSpec } from './plot-spec';

vi.mock('./g2-plot', () => import('./testing/fake-g2-plot'));

describe('chart axes on screen', () => {
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
