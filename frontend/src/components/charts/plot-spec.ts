import { CHART_PALETTE, GYRE_COLORS } from '../../app/theme';

/** One G2 mark (line, area, point, rangeX, lineX, lineY, text) as plain data. */
export interface MarkSpec {
  type: string;
  data?: unknown;
  encode?: Record<string, unknown>;
  scale?: Record<string, unknown>;
  style?: Record<string, unknown>;
  labels?: Array<Record<string, unknown>>;
  tooltip?: false | Record<string, unknown>;
  axis?: false | Record<string, unknown>;
  legend?: false | Record<string, unknown>;
  animate?: false | Record<string, unknown>;
  zIndex?: number;
}

/** A G2 view: shared scales and axes, and the marks drawn in it, back to front. */
export interface PlotSpec {
  type: 'view';
  padding?: number | 'auto';
  marginTop?: number;
  scale?: Record<string, unknown>;
  axis?: Record<string, unknown>;
  legend?: false | Record<string, unknown>;
  interaction?: Record<string, unknown>;
  theme?: Record<string, unknown>;
  animate?: false;
  children: MarkSpec[];
}

const AXIS_TEXT = {
  labelFontFamily: "'IBM Plex Sans', system-ui, sans-serif",
  labelFontSize: 12,
  labelFill: GYRE_COLORS.ink,
  titleFontFamily: "'IBM Plex Sans', system-ui, sans-serif",
  titleFontSize: 12,
  titleFill: GYRE_COLORS.ink,
  gridStroke: GYRE_COLORS.line,
  gridStrokeOpacity: 1,
};

/**
 * An axis whose title carries its unit, e.g. "Time from onset (s)"; `unit` is null only for
 * an axis of calendar dates, whose labels are dates.
 */
export function axisWithUnit(
  title: string,
  unit: string | null,
  options: { labelFormatter?: (value: number) => string; grid?: boolean } = {},
): Record<string, unknown> {
  return {
    ...AXIS_TEXT,
    title: unit === null ? title : `${title} (${unit})`,
    grid: options.grid ?? true,
    ...(options.labelFormatter === undefined ? {} : { labelFormatter: options.labelFormatter }),
  };
}

/**
 * A view with Gyre's palette and no entry animation (results should not wiggle in). G2 animates
 * each mark on its own, so every mark is told too.
 */
export function gyreView(spec: Omit<PlotSpec, 'type' | 'theme' | 'animate'>): PlotSpec {
  return {
    type: 'view',
    animate: false,
    theme: { category10: CHART_PALETTE, color: CHART_PALETTE[0] },
    ...spec,
    children: spec.children.map((mark) => ({ animate: false, ...mark })),
  };
}
