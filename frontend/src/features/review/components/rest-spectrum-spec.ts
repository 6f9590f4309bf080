import { CHART_PALETTE, GYRE_COLORS } from '../../../app/theme';
import {
  axisWithUnit,
  gyreView,
  type MarkSpec,
  type PlotSpec,
} from '../../../components/charts/plot-spec';

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

/** Plain decimals on the log axis (0.02, 5, 100), never "1.0e+2". */
export function powerLabel(value: number): string {
  return String(Number(value.toPrecision(2)));
}

function marker(frequencyHz: number, colour: string, text: string, position: string): MarkSpec {
  return {
    type: 'lineX',
    data: [frequencyHz],
    style: { stroke: colour, lineWidth: 1.5, lineDash: [5, 3] },
    labels: [{ text, position, dx: 4, fill: colour, fontSize: 11, fontWeight: 600 }],
    tooltip: false,
  };
}

/** Power spectral density (log scale) with the alpha window shaded and PAF and CoG marked. */
export function restSpectrumSpec(options: {
  points: SpectrumPoint[];
  alphaWindowHz: [number, number];
  pafHz: number | null;
  cogHz: number | null;
}): PlotSpec {
  const { points, alphaWindowHz, pafHz, cogHz } = options;
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
        title: (d: SpectrumPoint) => `${d.frequencyHz.toFixed(2)} Hz`,
        items: [
          {
            channel: 'y',
            name: 'Power',
            valueFormatter: (v: number) => `${v.toPrecision(3)} µV²/Hz`,
          },
        ],
      },
    },
  ];
  if (pafHz !== null)
    children.push(marker(pafHz, PAF_COLOUR, `PAF ${pafHz.toFixed(2)} Hz`, 'top-left'));
  if (cogHz !== null)
    children.push(marker(cogHz, COG_COLOUR, `CoG ${cogHz.toFixed(2)} Hz`, 'bottom-right'));
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
    scale: {
      x: {
        type: 'linear',
        nice: false,
        domain: [points[0]?.frequencyHz ?? 1, points[points.length - 1]?.frequencyHz ?? 40],
      },
      y: { type: 'log' },
    },
    axis: {
      x: axisWithUnit('Frequency', 'Hz', { labelFormatter: (v) => v.toFixed(0) }),
      y: axisWithUnit('Power (log scale)', 'µV²/Hz', { labelFormatter: powerLabel }),
    },
    legend: false,
    children,
  });
}
