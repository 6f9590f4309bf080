import { linearAxis, UNIT_SPACE } from '@gyre/shared';
import { useEffect, useRef, useState } from 'react';
import { GYRE_COLORS } from '../../app/theme';
import { rampCssGradient, rampRgb } from './frequency-colour-scale';
import { xTickCount } from './plot-spec';
import './charts.css';

export interface HeatmapMatrix {
  /** Row-major values, `rows × columns` long; NaN where there is no value. */
  values: ArrayLike<number>;
  rows: number;
  columns: number;
  /** The x value of the first and last column's centre. */
  xRange: readonly [number, number];
}

const MARGIN = { left: 56, right: 12, top: 8, bottom: 40 };

/**
 * A matrix drawn cell by cell on a canvas (one pixel per cell, scaled up without smoothing),
 * with axes and a colour legend in SVG/HTML so that their text stays crisp and readable.
 */
export function HeatmapCanvas({
  label,
  matrix,
  colourDomain,
  xTitle,
  yTitle,
  legendTitle,
  legendUnit,
  verticalMarkers = [],
  heightPx = 280,
}: {
  label: string;
  matrix: HeatmapMatrix;
  colourDomain: readonly [number, number];
  xTitle: string;
  yTitle: string;
  legendTitle: string;
  /** The unit written after each legend label, e.g. "Hz". */
  legendUnit: string;
  /** x positions of dashed reference lines (e.g. stimulus onset at 0 s). */
  verticalMarkers?: number[];
  heightPx?: number;
}) {
  const frameRef = useRef<HTMLDivElement>(null);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const [widthPx, setWidthPx] = useState(640);

  useEffect(() => {
    const frame = frameRef.current;
    if (frame === null) return;
    const measure = () => {
      const measured = frame.clientWidth;
      if (measured > 0) setWidthPx(measured);
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(frame);
    return () => observer.disconnect();
  }, []);

  const plotWidth = Math.max(10, widthPx - MARGIN.left - MARGIN.right);
  const plotHeight = Math.max(10, heightPx - MARGIN.top - MARGIN.bottom);

  useEffect(() => {
    const canvas = canvasRef.current;
    if (canvas === null || matrix.rows === 0 || matrix.columns === 0) return;
    const context = canvas.getContext('2d');
    if (context === null) return;
    const image = context.createImageData(matrix.columns, matrix.rows);
    for (let row = 0; row < matrix.rows; row += 1) {
      for (let column = 0; column < matrix.columns; column += 1) {
        const cell = row * matrix.columns + column;
        const [r, g, b] = rampRgb(Number(matrix.values[cell]), colourDomain);
        image.data[cell * 4] = r;
        image.data[cell * 4 + 1] = g;
        image.data[cell * 4 + 2] = b;
        image.data[cell * 4 + 3] = 255;
      }
    }
    context.putImageData(image, 0, 0);
  }, [matrix, colourDomain]);

  const [xFirst, xLast] = matrix.xRange;
  // Cells are centred on their x value: the drawn span reaches half a cell past each end.
  const halfCell = matrix.columns > 1 ? (xLast - xFirst) / (matrix.columns - 1) / 2 : 0.5;
  const xMin = xFirst - halfCell;
  const xMax = xLast + halfCell;
  const xToPx = (x: number) => ((x - xMin) / (xMax - xMin)) * plotWidth;
  // Ticks from shared/src/chart-ticks.ts: inside the drawn span, distinct labels.
  const xTicks = linearAxis(xMin, xMax, {
    count: xTickCount(widthPx, 56),
    nice: false,
    minDecimals: 1,
    signed: true,
  }).ticks;
  // Trial numbers: at most rows − 1 intervals keeps the step whole.
  const yTicks = linearAxis(1, Math.max(2, matrix.rows), {
    count: Math.max(1, Math.min(matrix.rows - 1, Math.floor(plotHeight / 40))),
    nice: false,
  }).ticks.filter((t) => Number.isInteger(t.value) && t.value <= matrix.rows);
  const rowToPx = (trialNumber: number) => ((trialNumber - 0.5) / matrix.rows) * plotHeight;
  const legendTicks = linearAxis(colourDomain[0], colourDomain[1], {
    count: 5,
    nice: false,
    minDecimals: 1,
  }).ticks;
  const legendSpan = colourDomain[1] - colourDomain[0] || 1;

  return (
    <figure aria-label={label} className="gyre-flush">
      <div ref={frameRef} style={{ position: 'relative', height: heightPx, width: '100%' }}>
        <canvas
          ref={canvasRef}
          width={Math.max(1, matrix.columns)}
          height={Math.max(1, matrix.rows)}
          data-gyre-heatmap={label}
          style={{
            position: 'absolute',
            left: MARGIN.left,
            top: MARGIN.top,
            width: plotWidth,
            height: plotHeight,
            imageRendering: 'pixelated',
          }}
        />
        <svg
          width={widthPx}
          height={heightPx}
          className="gyre-heatmap-axes"
          aria-hidden="true"
          fontFamily="'IBM Plex Sans', system-ui, sans-serif"
          fontSize={12}
          fill={GYRE_COLORS.ink}
        >
          <g transform={`translate(${MARGIN.left},${MARGIN.top})`}>
            <rect width={plotWidth} height={plotHeight} fill="none" stroke={GYRE_COLORS.line} />
            {verticalMarkers.map((x) => (
              <line
                key={x}
                x1={xToPx(x)}
                x2={xToPx(x)}
                y1={0}
                y2={plotHeight}
                stroke={GYRE_COLORS.ink}
                strokeDasharray="4 3"
                strokeWidth={1.5}
              />
            ))}
            {xTicks.map((t) => (
              <g key={t.value} transform={`translate(${xToPx(t.value)},${plotHeight})`}>
                <line y2={5} stroke={GYRE_COLORS.ink} />
                <text y={18} textAnchor="middle">
                  {t.label}
                </text>
              </g>
            ))}
            {yTicks.map((t) => (
              <g key={t.value} transform={`translate(0,${rowToPx(t.value)})`}>
                <line x2={-5} stroke={GYRE_COLORS.ink} />
                <text x={-8} dy="0.32em" textAnchor="end">
                  {t.label}
                </text>
              </g>
            ))}
            <text x={plotWidth / 2} y={plotHeight + 34} textAnchor="middle">
              {xTitle}
            </text>
            <text transform={`translate(${-40},${plotHeight / 2}) rotate(-90)`} textAnchor="middle">
              {yTitle}
            </text>
          </g>
        </svg>
      </div>
      <div
        role="group"
        aria-label={`${legendTitle} colour legend`}
        style={{ marginLeft: MARGIN.left, marginRight: MARGIN.right, marginTop: 4, maxWidth: 360 }}
      >
        <div className="gyre-heatmap-legend-title">{legendTitle}</div>
        <div
          className="gyre-heatmap-ramp"
          style={{ background: rampCssGradient() }}
          aria-hidden="true"
        />
        <div className="gyre-figures gyre-heatmap-legend-ticks">
          {legendTicks.map((t) => {
            const at = (t.value - colourDomain[0]) / legendSpan;
            // End labels align inwards so that none spills past the bar.
            const shift = at <= 0.001 ? '0' : at >= 0.999 ? '-100%' : '-50%';
            return (
              <span
                key={t.value}
                className="gyre-heatmap-legend-tick"
                style={{ left: `${at * 100}%`, transform: `translateX(${shift})` }}
              >
                {`${t.label}${UNIT_SPACE}${legendUnit}`}
              </span>
            );
          })}
        </div>
      </div>
    </figure>
  );
}
