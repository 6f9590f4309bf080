import { PAGE, REPORT_COLORS, ReportCanvas } from './report-canvas';
import { formatQuantityRange, MIN_AXIS_SPAN_HZ } from '@gyre/shared';
import { formatHz } from './report-numbers';
import { logScale, niceLinearScale, Scale } from './plot-scales';
import { RestSection, TaskSection } from './visit-report-model';

interface Box {
  xPt: number;
  yPt: number;
  widthPt: number;
  heightPt: number;
}

const Y_LABEL_ROOM_PT = 54;
const X_LABEL_ROOM_PT = 34;
const DEFAULT_SPECTRUM_RANGE_HZ: [number, number] = [1, 30];

/**
 * The rest spectrum as vector paths: ROI power spectral density on a log axis over the
 * display range, the alpha window shaded, PAF (solid) and CoG (dashed) marked.
 */
export function drawSpectrumPlot(canvas: ReportCanvas, rest: RestSection, heightPt = 200): void {
  const [fromHz, toHz] = rest.displayRangeHz ?? DEFAULT_SPECTRUM_RANGE_HZ;
  const points = rest.spectrum.frequencyHz
    .map((frequencyHz, i) => ({ frequencyHz, power: rest.spectrum.powerUv2PerHz[i] }))
    .filter(
      (p) =>
        p.frequencyHz >= fromHz && p.frequencyHz <= toHz && Number.isFinite(p.power) && p.power > 0,
    );
  const box = reserve(canvas, heightPt);
  if (points.length < 2) {
    noData(canvas, box, 'No spectrum to draw: fewer than two positive values in the range.');
    return;
  }
  const inner = innerBox(box);
  // The display range as it is, ticks at a nice step inside it.
  const x = niceLinearScale(fromHz, toHz, [inner.xPt, inner.xPt + inner.widthPt], {
    count: 6,
    nice: false,
  });
  const powers = points.map((p) => p.power);
  const y = logScale(Math.min(...powers), Math.max(...powers), [
    inner.yPt + inner.heightPt,
    inner.yPt,
  ]);
  const { doc } = canvas;

  doc.save();
  doc.rect(inner.xPt, inner.yPt, inner.widthPt, inner.heightPt).clip();
  const [alphaLowHz, alphaHighHz] = rest.alphaWindowHz;
  doc
    .rect(x.toPt(alphaLowHz), inner.yPt, x.toPt(alphaHighHz) - x.toPt(alphaLowHz), inner.heightPt)
    .fillOpacity(0.1)
    .fill(REPORT_COLORS.band);
  doc.fillOpacity(1);
  gridLines(canvas, inner, x, y);
  polyline(
    canvas,
    points.map((p) => [x.toPt(p.frequencyHz), y.toPt(p.power)]),
  );
  doc.lineWidth(1.4).strokeColor(REPORT_COLORS.primary).stroke();
  if (rest.pafHz !== null) {
    verticalMarker(canvas, inner, x.toPt(rest.pafHz), REPORT_COLORS.amber, false);
  }
  if (rest.cogHz !== null) {
    verticalMarker(canvas, inner, x.toPt(rest.cogHz), REPORT_COLORS.second, true);
  }
  doc.restore();

  axes(canvas, inner, x, y, 'Frequency (Hz)', 'Power spectral density (µV²/Hz, log scale)');
  const legend: Array<[string, string, boolean]> = [['ROI spectrum', REPORT_COLORS.primary, false]];
  if (rest.pafHz !== null) legend.push([`PAF ${formatHz(rest.pafHz)}`, REPORT_COLORS.amber, false]);
  if (rest.cogHz !== null) legend.push([`CoG ${formatHz(rest.cogHz)}`, REPORT_COLORS.second, true]);
  legend.push([
    `alpha window ${formatQuantityRange(rest.alphaWindowHz, 'frequencyHz')}`,
    REPORT_COLORS.band,
    false,
  ]);
  drawLegend(canvas, inner, legend);
  canvas.doc.y = box.yPt + box.heightPt + 6;
}

/**
 * The onset curve: ROI mean instantaneous frequency around onset with its 95 % band, the
 * baseline and post windows shaded and onset at 0 s.
 */
export function drawOnsetCurvePlot(canvas: ReportCanvas, task: TaskSection, heightPt = 210): void {
  const curve = task.onsetCurve;
  const box = reserve(canvas, heightPt);
  const values = [...curve.meanHz, ...curve.ciLowHz, ...curve.ciHighHz].filter(
    (v): v is number => v !== null && Number.isFinite(v),
  );
  if (curve.timeS.length < 2 || values.length === 0) {
    noData(canvas, box, 'No onset curve to draw: no trial was kept.');
    return;
  }
  const inner = innerBox(box);
  // Time widened to whole steps (−1.0 to +2.0 s for the usual epoch), signed like the
  // windows; frequency at a nice step with distinct labels. The screen's onset curve has the
  // same axes (shared/src/chart-ticks.ts).
  const t0 = curve.timeS[0];
  const t1 = curve.timeS[curve.timeS.length - 1];
  const x = niceLinearScale(t0, t1, [inner.xPt, inner.xPt + inner.widthPt], {
    count: 6,
    minDecimals: 1,
    signed: true,
  });
  const y = niceLinearScale(
    Math.min(...values),
    Math.max(...values),
    [inner.yPt + inner.heightPt, inner.yPt],
    { count: 5, minSpan: MIN_AXIS_SPAN_HZ },
  );
  const { doc } = canvas;

  doc.save();
  doc.rect(inner.xPt, inner.yPt, inner.widthPt, inner.heightPt).clip();
  for (const [window, color] of [
    [task.baselineWindowS, REPORT_COLORS.band],
    [task.postWindowS, REPORT_COLORS.amber],
  ] as const) {
    doc
      .rect(x.toPt(window[0]), inner.yPt, x.toPt(window[1]) - x.toPt(window[0]), inner.heightPt)
      .fillOpacity(0.1)
      .fill(color);
  }
  doc.fillOpacity(1);
  gridLines(canvas, inner, x, y);
  for (const segment of segments(curve.timeS, curve.ciLowHz, curve.ciHighHz)) {
    const upper = segment.map((p) => [x.toPt(p.t), y.toPt(p.high)] as [number, number]);
    const lower = segment.map((p) => [x.toPt(p.t), y.toPt(p.low)] as [number, number]).reverse();
    polyline(canvas, [...upper, ...lower]);
    doc.closePath().fillOpacity(0.22).fill(REPORT_COLORS.primary);
    doc.fillOpacity(1);
  }
  for (const segment of segments(curve.timeS, curve.meanHz, curve.meanHz)) {
    polyline(
      canvas,
      segment.map((p) => [x.toPt(p.t), y.toPt(p.low)]),
    );
    doc.lineWidth(1.4).strokeColor(REPORT_COLORS.primary).stroke();
  }
  verticalMarker(canvas, inner, x.toPt(0), REPORT_COLORS.ink, true);
  doc.restore();

  axes(canvas, inner, x, y, 'Time from stimulus onset (s)', 'Instantaneous frequency (Hz)');
  drawLegend(canvas, inner, [
    ['ROI mean', REPORT_COLORS.primary, false],
    ['95 % CI (bootstrap)', '#A7BEC1', false],
    [`baseline ${windowText(task.baselineWindowS)}`, REPORT_COLORS.band, false],
    [`post ${windowText(task.postWindowS)}`, REPORT_COLORS.amber, false],
    ['onset', REPORT_COLORS.ink, true],
  ]);
  canvas.doc.y = box.yPt + box.heightPt + 6;
}

function windowText(window: [number, number]): string {
  return formatQuantityRange(window, 'timeFromOnsetS');
}

/** Contiguous runs where both series have values (a null breaks the line, never bridges it). */
function segments(
  timeS: number[],
  low: Array<number | null>,
  high: Array<number | null>,
): Array<Array<{ t: number; low: number; high: number }>> {
  const out: Array<Array<{ t: number; low: number; high: number }>> = [];
  let current: Array<{ t: number; low: number; high: number }> = [];
  for (let i = 0; i < timeS.length; i++) {
    const l = low[i];
    const h = high[i];
    if (l !== null && h !== null && l !== undefined && h !== undefined) {
      current.push({ t: timeS[i], low: l, high: h });
    } else if (current.length > 0) {
      out.push(current);
      current = [];
    }
  }
  if (current.length > 0) out.push(current);
  return out.filter((s) => s.length > 1);
}

function reserve(canvas: ReportCanvas, heightPt: number): Box {
  canvas.ensureSpace(heightPt + 24);
  return {
    xPt: PAGE.marginLeftPt,
    yPt: canvas.doc.y + 4,
    widthPt: PAGE.widthPt - PAGE.marginLeftPt - PAGE.marginRightPt,
    heightPt,
  };
}

function innerBox(box: Box): Box {
  return {
    xPt: box.xPt + Y_LABEL_ROOM_PT,
    yPt: box.yPt + 4,
    widthPt: box.widthPt - Y_LABEL_ROOM_PT - 8,
    heightPt: box.heightPt - X_LABEL_ROOM_PT - 4 - LEGEND_ROOM_PT,
  };
}

const LEGEND_ROOM_PT = 16;

function noData(canvas: ReportCanvas, box: Box, message: string): void {
  canvas.doc
    .rect(box.xPt, box.yPt, box.widthPt, 40)
    .lineWidth(0.6)
    .strokeColor(REPORT_COLORS.line)
    .stroke();
  canvas.textAt(message, box.xPt + 10, box.yPt + 14, { color: REPORT_COLORS.muted });
  canvas.doc.y = box.yPt + 48;
}

function polyline(canvas: ReportCanvas, points: Array<[number, number]>): void {
  const [first, ...rest] = points;
  canvas.doc.moveTo(first[0], first[1]);
  for (const [px, py] of rest) canvas.doc.lineTo(px, py);
}

function verticalMarker(
  canvas: ReportCanvas,
  inner: Box,
  xPt: number,
  color: string,
  dashed: boolean,
): void {
  const { doc } = canvas;
  doc
    .moveTo(xPt, inner.yPt)
    .lineTo(xPt, inner.yPt + inner.heightPt)
    .lineWidth(1.1);
  if (dashed) doc.dash(4, { space: 3 });
  doc.strokeColor(color).stroke();
  doc.undash();
}

function gridLines(canvas: ReportCanvas, inner: Box, x: Scale, y: Scale): void {
  const { doc } = canvas;
  doc.lineWidth(0.4).strokeColor(REPORT_COLORS.line);
  for (const { value } of x.ticks) {
    doc.moveTo(x.toPt(value), inner.yPt).lineTo(x.toPt(value), inner.yPt + inner.heightPt);
  }
  for (const { value } of y.ticks) {
    doc.moveTo(inner.xPt, y.toPt(value)).lineTo(inner.xPt + inner.widthPt, y.toPt(value));
  }
  doc.stroke();
}

function axes(
  canvas: ReportCanvas,
  inner: Box,
  x: Scale,
  y: Scale,
  xTitle: string,
  yTitle: string,
): void {
  const { doc } = canvas;
  const bottom = inner.yPt + inner.heightPt;
  doc
    .moveTo(inner.xPt, inner.yPt)
    .lineTo(inner.xPt, bottom)
    .lineTo(inner.xPt + inner.widthPt, bottom)
    .lineWidth(0.8)
    .strokeColor(REPORT_COLORS.ink)
    .stroke();
  const style = { sizePt: 7.5, color: REPORT_COLORS.muted } as const;
  for (const { value, label } of x.ticks) {
    const px = x.toPt(value);
    doc
      .moveTo(px, bottom)
      .lineTo(px, bottom + 3)
      .lineWidth(0.6)
      .strokeColor(REPORT_COLORS.ink);
    doc.stroke();
    canvas.textAt(label, px - canvas.widthOf(label, style) / 2, bottom + 5, style);
  }
  for (const { value, label } of y.ticks) {
    const py = y.toPt(value);
    doc
      .moveTo(inner.xPt - 3, py)
      .lineTo(inner.xPt, py)
      .lineWidth(0.6)
      .strokeColor(REPORT_COLORS.ink);
    doc.stroke();
    canvas.textAt(label, inner.xPt - 5, py - 3.5, { ...style, alignRight: true });
  }
  const titleStyle = { sizePt: 8.5, color: REPORT_COLORS.ink, role: 'medium' } as const;
  canvas.textAt(
    xTitle,
    inner.xPt + inner.widthPt / 2 - canvas.widthOf(xTitle, titleStyle) / 2,
    bottom + 17,
    titleStyle,
  );
  // The y title reads bottom to top beside the axis.
  const titleWidth = canvas.widthOf(yTitle, titleStyle);
  const cx = inner.xPt - Y_LABEL_ROOM_PT + 8;
  const cy = inner.yPt + inner.heightPt / 2;
  doc.save();
  doc.rotate(-90, { origin: [cx, cy] });
  canvas.textAt(yTitle, cx - titleWidth / 2, cy - 4, titleStyle);
  doc.restore();
}

function drawLegend(
  canvas: ReportCanvas,
  inner: Box,
  items: Array<[label: string, color: string, dashed: boolean]>,
): void {
  const { doc } = canvas;
  const style = { sizePt: 7.5, color: REPORT_COLORS.ink } as const;
  let xPt = inner.xPt;
  const yPt = inner.yPt + inner.heightPt + X_LABEL_ROOM_PT - 2;
  for (const [label, color, dashed] of items) {
    doc
      .moveTo(xPt, yPt + 4)
      .lineTo(xPt + 14, yPt + 4)
      .lineWidth(2);
    if (dashed) doc.dash(3, { space: 2 });
    doc.strokeColor(color).stroke();
    doc.undash();
    canvas.textAt(label, xPt + 18, yPt, style);
    xPt += 18 + canvas.widthOf(label, style) + 14;
  }
}
