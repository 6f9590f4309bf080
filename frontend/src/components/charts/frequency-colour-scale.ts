import { CHART_PALETTE } from '../../app/theme';

/** Low to high frequency, from Gyre's chart palette: teal, sage, olive, amber. */
export const FREQUENCY_RAMP = [
  CHART_PALETTE[0],
  CHART_PALETTE[2],
  CHART_PALETTE[5],
  CHART_PALETTE[1],
];

/** Shown where a cell has no value (a dropped trial, a gap). */
export const MISSING_CELL_RGB: readonly [number, number, number] = [232, 236, 237];

function hexToRgb(hex: string): [number, number, number] {
  const value = Number.parseInt(hex.slice(1), 16);
  return [(value >> 16) & 255, (value >> 8) & 255, value & 255];
}

const RAMP_RGB = FREQUENCY_RAMP.map(hexToRgb);

/**
 * The colour of a value on a linear ramp over `domain`; values outside are clamped and
 * non-finite values get {@link MISSING_CELL_RGB}.
 */
export function rampRgb(
  value: number,
  domain: readonly [number, number],
): [number, number, number] {
  if (!Number.isFinite(value)) return [...MISSING_CELL_RGB];
  const [low, high] = domain;
  const span = high - low;
  const unit = span > 0 ? Math.min(1, Math.max(0, (value - low) / span)) : 0.5;
  const position = unit * (RAMP_RGB.length - 1);
  const index = Math.min(RAMP_RGB.length - 2, Math.floor(position));
  const within = position - index;
  const from = RAMP_RGB[index];
  const to = RAMP_RGB[index + 1];
  return [0, 1, 2].map((c) => Math.round(from[c] + (to[c] - from[c]) * within)) as [
    number,
    number,
    number,
  ];
}

/** A CSS gradient of the same ramp, for the legend. */
export function rampCssGradient(direction = 'to right'): string {
  const stops = FREQUENCY_RAMP.map(
    (colour, i) => `${colour} ${Math.round((i / (FREQUENCY_RAMP.length - 1)) * 100)}%`,
  );
  return `linear-gradient(${direction}, ${stops.join(', ')})`;
}
