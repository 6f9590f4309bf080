import { Skeleton } from 'antd';
import { lazy, Suspense } from 'react';
import type { PlotSpec } from './plot-spec';

const G2Plot = lazy(() => import('./g2-plot'));

/**
 * A chart as a labelled figure. The chart library is loaded lazily; the caption says in
 * words what the chart shows, for readers who cannot see the canvas.
 */
export function PlotFigure({
  label,
  spec,
  heightPx = 300,
  caption,
}: {
  label: string;
  spec: PlotSpec;
  heightPx?: number;
  caption?: React.ReactNode;
}) {
  return (
    <figure aria-label={label} style={{ margin: 0 }}>
      <div style={{ height: heightPx }} data-gyre-chart={label}>
        <Suspense fallback={<Skeleton.Node active style={{ width: '100%', height: heightPx }} />}>
          <G2Plot spec={spec} height={heightPx} />
        </Suspense>
      </div>
      {caption === undefined ? null : (
        <figcaption style={{ marginTop: 8, color: 'rgba(29,43,47,0.72)', fontSize: 13 }}>
          {caption}
        </figcaption>
      )}
    </figure>
  );
}
