import {
  placeLabels,
  type ScalpMapChannel,
  type ScalpMapMeasure,
  type ScalpMapModel,
  type ScalpMapSource,
  SCALP_DIVERGING_STOPS,
  SCALP_MEASURE_NAMES,
  SCALP_OUTER_RADIUS,
  SCALP_RING_RADIUS,
  SCALP_SEQUENTIAL_STOPS,
  scalpColourOf,
  scalpEarBoxes,
  scalpMapOf,
  scalpMarkLines,
} from '@gyre/shared';
import { GYRE_COLORS } from '@gyre/shared/palette';
import { PAGE, REPORT_COLORS, ReportCanvas } from './report-canvas';
import { ROI_OMISSION_WORDS } from './report-wording';
import type { RestSection, ScalpMapChannels, TaskSection } from './visit-report-model';

/*
 * Scalp maps in the visit report: the same map as Review's (positions from
 * shared/src/scalp-positions.ts, channels, marks and colour scale from shared/src/scalp-map.ts,
 * where each name goes from shared/src/scalp-label-placement.ts), drawn as vector paths.
 */

/** One unit of the map's disc on paper (the 10-10 ring, where the head is outlined). */
const RING_PT = 72;
/** Half the drawing's side in ring radii: room for the 9/10 columns, Nz and Iz. */
const HALF_VIEW = SCALP_OUTER_RADIUS + 0.11;
/** Dot and name in the proportions of Review's map (0.07 and 0.09 of the ring's radius). */
const DOT_PT = 5;
/** The channel names: 6.5 pt, above 6 pt, the smallest print to read (common practice). */
const NAME = { sizePt: 6.5, color: REPORT_COLORS.ink } as const;
const PANEL_GAP_PT = 24;
const BAR_WIDTH_PT = 120;
const BAR_HEIGHT_PT = 8;
const SMALL = { sizePt: 7.5, color: REPORT_COLORS.ink } as const;

/**
 * A section's per-channel numbers for its maps, from its results, under the key `scalpMap`; no
 * key when no channel with a 10-10 position has a value for any of the measures (nothing to
 * map, e.g. resting runs made before per-channel PAF and CoG), so such reports stay as they were.
 */
export function scalpMapPartOf(
  results: Pick<ScalpMapSource, 'channels' | 'quality'> & { run: Pick<ScalpMapSource, 'roiUsage'> },
  measures: readonly ScalpMapMeasure[],
): { scalpMap?: ScalpMapChannels } {
  const scalpMap: ScalpMapChannels = {
    channels: results.channels.map((c) => ({
      label: c.label,
      canonical: c.canonical,
      pafHz: c.pafHz,
      cogHz: c.cogHz,
      deltaFHz: c.deltaFHz,
    })),
    flatChannels: results.quality.flatChannels,
    saturatedChannels: results.quality.saturatedChannels,
  };
  const source = { ...scalpMap, roiUsage: results.run.roiUsage, quality: scalpMap };
  const mapped = measures.some((measure) => scalpMapOf(source, measure).scale !== null);
  return mapped ? { scalpMap } : {};
}

/** The rest section's PAF and CoG maps side by side, when its channels have values. */
export function drawRestScalpMaps(canvas: ReportCanvas, rest: RestSection | null): void {
  if (rest?.scalpMap === undefined || rest.roiUsage.status === 'none') return;
  drawScalpMaps(canvas, 'Rest: scalp maps', mapsOf(rest.scalpMap, rest.roiUsage, ['paf', 'cog']));
}

/** The task section's Δf map, when its channels have values. */
export function drawTaskScalpMap(canvas: ReportCanvas, task: TaskSection | null): void {
  if (task?.scalpMap === undefined || task.roiUsage.status === 'none') return;
  drawScalpMaps(canvas, 'Task: scalp map', mapsOf(task.scalpMap, task.roiUsage, ['deltaF']));
}

function mapsOf(
  values: ScalpMapChannels,
  roiUsage: RestSection['roiUsage'],
  measures: ScalpMapMeasure[],
): ScalpMapModel[] {
  return measures.map((measure) =>
    scalpMapOf({ channels: values.channels, roiUsage, quality: values }, measure),
  );
}

/** Maps in a row below the cursor under a title, each with its colour bar and uncoloured channels. */
export function drawScalpMaps(canvas: ReportCanvas, title: string, maps: ScalpMapModel[]): void {
  const panelWidthPt = 2 * HALF_VIEW * RING_PT;
  canvas.ensureSpace(2 * HALF_VIEW * RING_PT + NAME.sizePt + 130);
  canvas.gap(8);
  canvas.paragraph(title, { role: 'bold', sizePt: 10.5, color: REPORT_COLORS.primary });
  canvas.gap(4);
  const top = canvas.doc.y;
  let bottom = top;
  maps.forEach((map, i) => {
    const left = PAGE.marginLeftPt + i * (panelWidthPt + PANEL_GAP_PT);
    bottom = Math.max(
      bottom,
      drawPanel(canvas, map, { leftPt: left, topPt: top, widthPt: panelWidthPt }),
    );
  });
  canvas.doc.y = bottom + 4;
  canvas.paragraph(
    'Scalp maps: each channel at its 10-10 position on a spherical head (Oostenveld & ' +
      'Praamstra 2001), seen from above, nose up, left on the left, named beside its dot. ' +
      'Hollow with a cross: left out; dashed: asked for but not in the file; grey: no value.',
    { sizePt: 8, color: REPORT_COLORS.muted },
  );
  canvas.gap(4);
}

/** Where a panel goes on the page. */
interface Place {
  leftPt: number;
  topPt: number;
  widthPt: number;
}

/** One map with its title, colour bar and marks key; returns the y it ends at. */
function drawPanel(canvas: ReportCanvas, map: ScalpMapModel, at: Place): number {
  const { leftPt: left, topPt: top, widthPt } = at;
  canvas.textAt(SCALP_MEASURE_NAMES[map.measure], left, top, {
    role: 'medium',
    sizePt: 9,
    widthPt,
  });
  const cx = left + widthPt / 2;
  const cy = top + 14 + HALF_VIEW * RING_PT;
  drawHead(canvas, cx, cy);
  for (const channel of map.channels) drawChannel(canvas, map, channel, cx, cy);
  drawChannelNames(canvas, map.channels, cx, cy);
  let y = cy + HALF_VIEW * RING_PT + NAME.sizePt + 4;
  if (map.scale === null) {
    canvas.textAt('No channel has a value: no colour scale.', left, y, {
      ...SMALL,
      color: REPORT_COLORS.muted,
      widthPt,
    });
    y = canvas.doc.y + 4;
  } else {
    y = drawColourBar(canvas, map, cx - BAR_WIDTH_PT / 2, y);
  }
  return drawMarksKey(canvas, map, { ...at, topPt: y });
}

function drawHead(canvas: ReportCanvas, cx: number, cy: number): void {
  const { doc } = canvas;
  const head = SCALP_RING_RADIUS * RING_PT;
  doc.circle(cx, cy, head).fillColor(GYRE_COLORS.mist).fill();
  doc.lineWidth(1).strokeColor(REPORT_COLORS.muted);
  doc.circle(cx, cy, head).stroke();
  doc
    .moveTo(cx - 0.1 * head, cy - 0.995 * head)
    .lineTo(cx, cy - 1.12 * head)
    .lineTo(cx + 0.1 * head, cy - 0.995 * head)
    .stroke();
  for (const ear of scalpEarBoxes(head)) {
    const [rx, ry] = [(ear.x1 - ear.x0) / 2, (ear.y1 - ear.y0) / 2];
    doc.ellipse(cx + ear.x0 + rx, cy + ear.y0 + ry, rx, ry).stroke();
  }
}

/** A channel's dot centre relative to the head's centre, in points (y down). */
function offsetOf(channel: ScalpMapChannel): readonly [number, number] {
  return [channel.point[0] * RING_PT, -channel.point[1] * RING_PT];
}

/**
 * Each channel's 10-10 name beside its dot, on the side the shared placement picks (off the
 * other dots, the ears and the names already placed, measured in the report's own font),
 * drawn over every dot.
 */
function drawChannelNames(
  canvas: ReportCanvas,
  channels: readonly ScalpMapChannel[],
  cx: number,
  cy: number,
): void {
  const dots = channels.map((channel) => ({ name: channel.name, centre: offsetOf(channel) }));
  const head = SCALP_RING_RADIUS * RING_PT;
  const widthOf = (name: string) => canvas.widthOf(name, NAME);
  const placed = placeLabels(dots, DOT_PT, NAME.sizePt, scalpEarBoxes(head), widthOf);
  dots.forEach(({ name, centre }, i) => {
    const { dx, dy, anchor } = placed[i];
    const width = widthOf(name);
    const shift = anchor === 'middle' ? width / 2 : anchor === 'end' ? width : 0;
    canvas.textAt(name, cx + centre[0] + dx - shift, cy + centre[1] + dy, {
      ...NAME,
      onBaseline: true,
    });
  });
}

function drawChannel(
  canvas: ReportCanvas,
  map: ScalpMapModel,
  channel: ScalpMapChannel,
  cx: number,
  cy: number,
): void {
  const [x, y] = offsetOf(channel);
  drawMark(
    canvas,
    channel.mark,
    cx + x,
    cy + y,
    DOT_PT,
    channel.mark === 'value' && map.scale !== null && channel.valueHz !== null
      ? scalpColourOf(channel.valueHz, map.scale)
      : null,
  );
}

/** A dot by its mark: coloured, grey, hollow with a cross, or dashed and hollow. */
function drawMark(
  canvas: ReportCanvas,
  mark: ScalpMapChannel['mark'],
  x: number,
  y: number,
  r: number,
  fill: string | null,
): void {
  const { doc } = canvas;
  doc.lineWidth(0.6);
  if (mark === 'value' && fill !== null) {
    doc.circle(x, y, r).fillAndStroke(fill, REPORT_COLORS.ink);
  } else if (mark === 'no-value' || mark === 'value') {
    doc.circle(x, y, r).fillAndStroke(REPORT_COLORS.line, REPORT_COLORS.muted);
  } else if (mark === 'missing') {
    doc.circle(x, y, r).dash(1.5, { space: 1 }).strokeColor(REPORT_COLORS.muted).stroke();
    doc.undash();
  } else {
    doc.circle(x, y, r).fillAndStroke(GYRE_COLORS.paper, REPORT_COLORS.ink);
    const arm = r * 0.7;
    doc
      .moveTo(x - arm, y - arm)
      .lineTo(x + arm, y + arm)
      .moveTo(x - arm, y + arm)
      .lineTo(x + arm, y - arm)
      .strokeColor(REPORT_COLORS.ink)
      .stroke();
  }
}

/** The scale's gradient with its ticks (number-format labels) and the unit; returns its bottom. */
function drawColourBar(
  canvas: ReportCanvas,
  map: ScalpMapModel,
  left: number,
  top: number,
): number {
  const scale = map.scale;
  if (scale === null) return top;
  const { doc } = canvas;
  const stops = scale.diverging ? SCALP_DIVERGING_STOPS : SCALP_SEQUENTIAL_STOPS;
  const gradient = doc.linearGradient(left, 0, left + BAR_WIDTH_PT, 0);
  stops.forEach((colour, i) => gradient.stop(i / (stops.length - 1), colour));
  doc.rect(left, top, BAR_WIDTH_PT, BAR_HEIGHT_PT).fill(gradient);
  doc
    .rect(left, top, BAR_WIDTH_PT, BAR_HEIGHT_PT)
    .lineWidth(0.4)
    .strokeColor(REPORT_COLORS.muted)
    .stroke();
  const [low, high] = scale.domainHz;
  for (const tick of scale.ticks) {
    const x = left + ((tick.value - low) / (high - low)) * BAR_WIDTH_PT;
    doc
      .moveTo(x, top + BAR_HEIGHT_PT)
      .lineTo(x, top + BAR_HEIGHT_PT + 2.5)
      .lineWidth(0.5)
      .strokeColor(REPORT_COLORS.ink)
      .stroke();
    canvas.textAt(
      tick.label,
      x - canvas.widthOf(tick.label, SMALL) / 2,
      top + BAR_HEIGHT_PT + 3.5,
      SMALL,
    );
  }
  const unit = 'Hz';
  canvas.textAt(unit, left + BAR_WIDTH_PT + 6, top, { ...SMALL, role: 'medium' });
  return top + BAR_HEIGHT_PT + 16;
}

/** The channels drawn without a colour, each named with why. */
function drawMarksKey(canvas: ReportCanvas, map: ScalpMapModel, at: Place): number {
  const { lines, unplaced } = scalpMarkLines(map, (reason) => ROI_OMISSION_WORDS[reason]);
  let y = at.topPt;
  for (const line of lines) {
    drawMark(canvas, line.mark, at.leftPt + 4, y + 4, 3.2, null);
    canvas.textAt(line.text, at.leftPt + 12, y, { ...SMALL, widthPt: at.widthPt - 12 });
    y = Math.max(canvas.doc.y, y + 10) + 2;
  }
  if (unplaced !== null) {
    canvas.textAt(unplaced, at.leftPt, y, {
      ...SMALL,
      color: REPORT_COLORS.muted,
      widthPt: at.widthPt,
    });
    y = canvas.doc.y + 2;
  }
  return y;
}
