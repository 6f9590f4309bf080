import {
  tickLabelAt,
  type AxisTick,
  type DateAxis,
  type LinearAxis,
  type LogAxis,
} from '@gyre/shared';
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
  /**
   * The tick labels the axes show (not passed to G2): the figure writes them into the page
   * as data attributes, since the chart itself is a canvas.
   */
  axisLabels?: { x?: string[]; y?: string[] };
}

/** Labels on a horizontal axis: about one per this many pixels. */
const X_LABEL_SPACING_PX = 72;
/** Labels on a vertical axis: about one per this many pixels. */
const Y_LABEL_SPACING_PX = 36;
/** Room the y axis's labels and title take beside the plot, roughly. */
const Y_AXIS_ROOM_PX = 80;
/** Room the x axis's labels and title and the chart's top margin take, roughly. */
const X_AXIS_ROOM_PX = 72;

/** How many x intervals to ask d3 for in a chart `widthPx` wide (at least 2). */
export function xTickCount(widthPx: number, labelWidthPx = X_LABEL_SPACING_PX): number {
  return Math.max(2, Math.min(10, Math.floor((widthPx - Y_AXIS_ROOM_PX) / labelWidthPx)));
}

/** How many y intervals to ask d3 for in a chart `heightPx` high (at least 2). */
export function yTickCount(heightPx: number): number {
  return Math.max(2, Math.min(8, Math.floor((heightPx - X_AXIS_ROOM_PX) / Y_LABEL_SPACING_PX)));
}

/** A G2 linear scale on the ticks of {@link linearAxis} (shared/src/chart-ticks.ts). */
export function linearScaleOf(axis: LinearAxis): Record<string, unknown> {
  const values = axis.ticks.map((t) => t.value);
  return { type: 'linear', domain: axis.domain, nice: false, tickMethod: () => values };
}

/** A G2 log scale on the ticks of {@link logAxis}. */
export function logScaleOf(axis: LogAxis): Record<string, unknown> {
  const values = axis.ticks.map((t) => t.value);
  return { type: 'log', domain: axis.domain, nice: false, tickMethod: () => values };
}

/** A G2 time scale on the ticks of {@link dateAxis} (UTC). */
export function timeScaleOf(axis: DateAxis): Record<string, unknown> {
  const dates = axis.ticks.map((t) => new Date(t.value));
  return {
    type: 'time',
    domain: axis.domain.map((ms) => new Date(ms)),
    nice: false,
    utc: true,
    tickMethod: () => dates,
  };
}

/** The axis's own label for each tick value G2 hands back (a number or a Date). */
export function tickLabelFormatter(axis: { ticks: AxisTick[] }): (value: unknown) => string {
  return (value) => tickLabelAt(axis, value instanceof Date ? value.getTime() : Number(value));
}

export const labelsOf = (axis: { ticks: AxisTick[] }): string[] => axis.ticks.map((t) => t.label);

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
  options: {
    labelFormatter?: (value: number) => string;
    grid?: boolean;
    /** Ticks from shared/src/chart-ticks.ts: every label shown, none hidden or rotated. */
    ticks?: { ticks: AxisTick[] };
  } = {},
): Record<string, unknown> {
  const labelFormatter =
    options.ticks !== undefined ? tickLabelFormatter(options.ticks) : options.labelFormatter;
  return {
    ...AXIS_TEXT,
    title: unit === null ? title : `${title} (${unit})`,
    grid: options.grid ?? true,
    ...(options.ticks === undefined
      ? {}
      : { labelAutoHide: false, labelAutoRotate: false, labelAutoEllipsis: false }),
    ...(labelFormatter === undefined ? {} : { labelFormatter }),
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
