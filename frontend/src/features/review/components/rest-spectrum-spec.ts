import { linearAxis, logAxis } from '@gyre/shared';
import { CHART_PALETTE, GYRE_COLORS } from '../../../app/theme';
import {
  axisWithUnit,
  gyreView,
  labelsOf,
  linearScaleOf,
  logScaleOf,
  xTickCount,
  yTickCount,
  type MarkSpec,
  type PlotSpec,
} from '../../../components/charts/plot-spec';
import { formatHz, formatPowerUv2PerHz } from '../../../lib/format';

export interface SpectrumPoint {
  frequencyHz: number;
  powerUv2PerHz: number;
}

export const SPECTRUM_COLOUR = CHART_PALETTE[0];
export const PAF_COLOUR = CHART_PALETTE[3];
export const COG_COLOUR = CHART_PALETTE[4];

/** The part of the spectrum worth drawing: 1–40 Hz, positive power only (the axis is logarithmic). */
export function spectrumPoints(
  frequencyHz: number[],
  powerUv2PerHz: number[],
  shownHz: [number, number] = [1, 40],
): SpectrumPoint[] {
  const points: SpectrumPoint[] = [];
  frequencyHz.forEach((f, i) => {
    const power = powerUv2PerHz[i];
    if (f < shownHz[0] || f > shownHz[1] || !(power > 0)) return;
    points.push({ frequencyHz: f, powerUv2PerHz: power });
  });
  return points;
}

/**
 * A dashed vertical line at PAF or CoG. It carries no label inside the plot: the key above the
 * chart names both lines with their values, and two labels at nearly the same frequency
 * would cover each other and the curve on a narrow screen.
 */
function marker(frequencyHz: number, colour: string): MarkSpec {
  return {
    type: 'lineX',
    data: [frequencyHz],
    style: { stroke: colour, lineWidth: 1.5, lineDash: [5, 3] },
    tooltip: false,
  };
}

/**
 * Power spectral density (log scale) with the alpha window shaded and PAF and CoG marked.
 * Ticks from shared/src/chart-ticks.ts: frequency at a nice step inside the shown range,
 * power at 1-2-5 or whole decades, all in one notation.
 */
export function restSpectrumSpec(options: {
  points: SpectrumPoint[];
  alphaWindowHz: [number, number];
  pafHz: number | null;
  cogHz: number | null;
  widthPx?: number;
  heightPx?: number;
}): PlotSpec {
  const { points, alphaWindowHz, pafHz, cogHz } = options;
  const widthPx = options.widthPx ?? 640;
  const heightPx = options.heightPx ?? 280;
  const x = linearAxis(points[0]?.frequencyHz ?? 1, points[points.length - 1]?.frequencyHz ?? 40, {
    count: xTickCount(widthPx, 48),
    nice: false,
  });
  const powers = points.map((p) => p.powerUv2PerHz);
  const y = logAxis(Math.min(...powers), Math.max(...powers), {
    maxTicks: yTickCount(heightPx) + 1,
  });
  const children: MarkSpec[] = [
    {
      type: 'rangeX',
      data: [{ start: alphaWindowHz[0], end: alphaWindowHz[1] }],
      encode: { x: 'start', x1: 'end' },
      style: { fill: CHART_PALETTE[2], fillOpacity: 0.12 },
      tooltip: false,
    },
    {
      type: 'line',
      data: points,
      encode: { x: 'frequencyHz', y: 'powerUv2PerHz' },
      style: { stroke: SPECTRUM_COLOUR, lineWidth: 2 },
      tooltip: {
        title: (d: SpectrumPoint) => formatHz(d.frequencyHz),
        items: [{ channel: 'y', name: 'Power', valueFormatter: formatPowerUv2PerHz }],
      },
    },
  ];
  if (pafHz !== null) children.push(marker(pafHz, PAF_COLOUR));
  if (cogHz !== null) children.push(marker(cogHz, COG_COLOUR));
  if (pafHz === null && points.length > 0) {
    // Placed just above the spectrum's highest point, so it never hides the curve.
    const top = Math.max(...points.map((p) => p.powerUv2PerHz));
    children.push({
      type: 'text',
      data: [
        {
          frequencyHz: (alphaWindowHz[0] + alphaWindowHz[1]) / 2,
          powerUv2PerHz: top,
          text: 'No clear peak',
        },
      ],
      encode: { x: 'frequencyHz', y: 'powerUv2PerHz', text: 'text' },
      style: {
        textAlign: 'center',
        dy: -4,
        fill: GYRE_COLORS.amber,
        fontSize: 12,
        fontWeight: 600,
      },
      tooltip: false,
    });
  }
  return gyreView({
    padding: 'auto',
    scale: { x: linearScaleOf(x), y: logScaleOf(y) },
    axis: {
      x: axisWithUnit('Frequency', 'Hz', { ticks: x }),
      y: axisWithUnit('Power (log scale)', 'µV²/Hz', { ticks: y }),
    },
    axisLabels: { x: labelsOf(x), y: labelsOf(y) },
    legend: false,
    children,
  });
}
