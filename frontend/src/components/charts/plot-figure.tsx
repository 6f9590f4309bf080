import { Skeleton } from 'antd';
import { lazy, Suspense, useEffect, useMemo, useRef, useState } from 'react';
import type { PlotSpec } from './plot-spec';
import './charts.css';

const G2Plot = lazy(() => import('./g2-plot'));

/** Widths are rounded to this many pixels before a spec is rebuilt for them. */
const WIDTH_STEP_PX = 40;
/** Before the first measurement (and in jsdom, which measures nothing). */
const DEFAULT_WIDTH_PX = 640;

/** The width of an element, kept up to date, in steps of {@link WIDTH_STEP_PX}. */
function useMeasuredWidth(): [React.RefObject<HTMLDivElement | null>, number] {
  const ref = useRef<HTMLDivElement>(null);
  const [widthPx, setWidthPx] = useState(DEFAULT_WIDTH_PX);
  useEffect(() => {
    const element = ref.current;
    if (element === null) return;
    const measure = () => {
      const measured = element.clientWidth;
      if (measured > 0)
        setWidthPx(Math.max(WIDTH_STEP_PX, Math.floor(measured / WIDTH_STEP_PX) * WIDTH_STEP_PX));
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(element);
    return () => observer.disconnect();
  }, []);
  return [ref, widthPx];
}

/**
 * A chart as a labelled figure. The chart library is loaded lazily; the caption says in
 * words what the chart shows, for readers who cannot see the canvas. A spec given as a
 * function of the width is rebuilt when the figure's width changes (tick counts and labels
 * that fit), and the figure never grows wider than its container. The axes' tick labels are
 * written as data attributes (`data-x-ticks`, `data-y-ticks`, JSON), since the chart is a
 * canvas.
 */
export function PlotFigure({
  label,
  spec,
  heightPx = 300,
  caption,
}: {
  label: string;
  spec: PlotSpec | ((widthPx: number) => PlotSpec);
  heightPx?: number;
  caption?: React.ReactNode;
}) {
  const [frameRef, widthPx] = useMeasuredWidth();
  const built = useMemo(() => (typeof spec === 'function' ? spec(widthPx) : spec), [spec, widthPx]);
  return (
    <figure aria-label={label} className="gyre-plot-figure">
      <div
        ref={frameRef}
        style={{ height: heightPx, width: '100%', minWidth: 0, overflow: 'hidden' }}
        data-gyre-chart={label}
        data-x-ticks={
          built.axisLabels?.x === undefined ? undefined : JSON.stringify(built.axisLabels.x)
        }
        data-y-ticks={
          built.axisLabels?.y === undefined ? undefined : JSON.stringify(built.axisLabels.y)
        }
      >
        <Suspense fallback={<Skeleton.Node active style={{ width: '100%', height: heightPx }} />}>
          <G2Plot spec={built} height={heightPx} />
        </Suspense>
      </div>
      {caption === undefined ? null : (
        <figcaption className="gyre-plot-caption">{caption}</figcaption>
      )}
    </figure>
  );
}
