import type { PlotSpec } from '../plot-spec';

/**
 * Stands in for the chart library in jsdom, which has no canvas: it shows which marks the
 * spec asks for, so tests can check what would be drawn.
 */
export default function FakeG2Plot({ spec }: { spec: PlotSpec; height: number }) {
  return (
    <div data-testid="g2-plot" data-marks={spec.children.map((mark) => mark.type).join(' ')} />
  );
}
