import PDFDocument from 'pdfkit';
import { formatQuantity, formatQuantityRange, type RoiUsageView } from '@gyre/shared';
import { BODY_WIDTH_PT, PAGE, PAGE_SETUP, REPORT_COLORS, ReportCanvas } from './report-canvas';
import { ReportFonts } from './report-fonts';
import { formatCiHz, formatDeltaHz, formatHz, formatPValue, formatUtc } from './report-numbers';
import { drawOnsetCurvePlot, drawSpectrumPlot } from './report-plots';
import { drawRestScalpMaps, drawTaskScalpMap } from './report-scalp-map';
import { drawTaskDepth } from './report-task-depth';
import {
  depthSettingsRows,
  droppedWords,
  kindName,
  noPeakWords,
  noRoiWords,
  partialRoiNote,
  qualitySentences,
  RESEARCH_CAUTION,
  roiUsageWords,
  sourceWords,
} from './report-wording';
import { assertValidModel } from './validate-report-model';
import {
  FlagEntry,
  FlagSuggestionEntry,
  RecordingSource,
  RestSection,
  TaskSection,
  VisitReportModel,
} from './visit-report-model';

export interface RenderVisitReportOptions {
  /** Folder of the shipped woff2 fonts; default the repository's `fonts/`. */
  fontsDir?: string;
}

/**
 * Draws a visit report as a PDF: identification, rest and task results with vector plots,
 * quality checks in words, flags, provenance and the signature block (or a draft label),
 * the research caution and page numbers on every page. Pure: the same model gives the same
 * bytes (the document date is the model's `generatedAtIso`).
 */
export async function renderVisitReport(
  model: VisitReportModel,
  options: RenderVisitReportOptions = {},
): Promise<Buffer> {
  assertValidModel(model);
  const fonts = ReportFonts.load(options.fontsDir);
  const doc = new PDFDocument({
    ...PAGE_SETUP,
    lang: 'en',
    info: {
      Title: `Visit report, participant ${model.participantCode}, visit ${model.visit.label}`,
      Author: 'Gyre',
      Subject: `${model.study.name}, revision ${model.revision}`,
      Creator: 'Gyre',
      Producer: 'Gyre (pdfkit)',
      CreationDate: new Date(model.generatedAtIso),
      ModDate: new Date(model.generatedAtIso),
    },
  });
  const done = collect(doc);
  fonts.registerWith(doc);
  const canvas = new ReportCanvas(doc, fonts);

  drawTitle(canvas, model);
  // A section's heading, numbers and plot stay on one page: when they do not fit below the
  // cursor, the section starts a new page (they always fit a fresh one).
  canvas.keepTogether((c) => drawRest(c, model.rest));
  canvas.keepTogether((c) => drawRestScalpMaps(c, model.rest));
  canvas.keepTogether((c) => drawTask(c, model.task));
  canvas.keepTogether((c) => drawTaskScalpMap(c, model.task));
  canvas.keepTogether((c) => drawTaskDepth(c, model.task));
  drawQuality(canvas, model);
  drawFlags(canvas, model);
  drawProvenance(canvas, model);
  drawSignature(canvas, model);
  drawPageFurniture(canvas, model);

  doc.end();
  return done;
}

function collect(doc: PDFKit.PDFDocument): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
}

function stateLabel(model: VisitReportModel): string {
  return model.signature === null ? 'DRAFT · NOT SIGNED' : `SIGNED · REVISION ${model.revision}`;
}

function drawTitle(canvas: ReportCanvas, model: VisitReportModel): void {
  const { doc } = canvas;
  const top = PAGE.marginTopPt - 20;
  canvas.textAt('Visit report', PAGE.marginLeftPt, top, {
    role: 'bold',
    sizePt: 22,
    color: REPORT_COLORS.primary,
  });
  const label = stateLabel(model);
  const labelStyle = { role: 'bold', sizePt: 9 } as const;
  const badgeWidth = canvas.widthOf(label, labelStyle) + 16;
  const badgeX = PAGE.marginLeftPt + BODY_WIDTH_PT - badgeWidth;
  const color = model.signature === null ? REPORT_COLORS.amber : REPORT_COLORS.primary;
  doc
    .roundedRect(badgeX, top + 4, badgeWidth, 20, 4)
    .lineWidth(1)
    .strokeColor(color)
    .stroke();
  canvas.textAt(label, badgeX + 8, top + 9, { ...labelStyle, color });
  doc.y = top + 38;

  const study =
    model.study.code === null ? model.study.name : `${model.study.name} (${model.study.code})`;
  const rows: Array<[string, string, ('mono' | 'regular')?]> = [
    ['Study', study],
    ['Site', model.site.name],
    ['Participant', model.participantCode],
    ['Visit', model.visit.label],
    ['Visit date', model.visit.date],
    ['Report', `revision ${model.revision}`],
    ['Report ID', model.reportId, 'mono'],
    ['Generated', formatUtc(model.generatedAtIso)],
  ];
  if (model.supersedes !== null) {
    rows.push(['Replaces', `signed revision ${model.supersedes.revision}`]);
    rows.push(['Its SHA-256', model.supersedes.sha256, 'mono']);
  }
  canvas.facts(rows);
}

function drawRest(canvas: ReportCanvas, rest: RestSection | null): void {
  const heading = 'Rest: individual alpha frequency';
  if (!opensWithNumbers(canvas, heading, rest, { kind: 'resting', measure: 'PAF or CoG' })) return;
  // A headline number from part of the ROI says so on its own row, not only further down.
  const note = partialRoiNote(rest.roiUsage);
  canvas.facts([
    [
      'Peak alpha frequency (PAF)',
      rest.pafHz === null ? noPeakWords(rest) : `${formatHz(rest.pafHz)}${note}`,
    ],
    [
      'Centre of gravity (CoG)',
      rest.cogHz === null ? 'not available' : `${formatHz(rest.cogHz)}${note}`,
    ],
    ['Alpha window', formatQuantityRange(rest.alphaWindowHz, 'frequencyHz')],
    [
      'Peak prominence',
      rest.prominenceDb === null ? 'no clear peak' : formatQuantity(rest.prominenceDb, 'decibel'),
    ],
  ]);
  drawBasis(
    canvas,
    rest,
    'Welch power spectrum of the region of interest (4 s Hann windows, 50 % overlap); PAF by ' +
      'parabolic interpolation of the highest peak, CoG as Σ f·P(f) / Σ P(f) over the alpha window.',
  );
  drawSpectrumPlot(canvas, rest);
}

function drawTask(canvas: ReportCanvas, task: TaskSection | null): void {
  const heading = 'Task: alpha frequency around stimulus onset';
  if (!opensWithNumbers(canvas, heading, task, { kind: 'task', measure: 'Δf' })) return;
  const trials =
    task.trialsKept === null || task.trialsTotal === null
      ? 'not available'
      : `${task.trialsKept} of ${task.trialsTotal} kept; ${droppedWords(task)}`;
  canvas.facts([
    [
      'Δf (post − baseline)',
      task.deltaFHz === null
        ? 'not available'
        : `${formatDeltaHz(task.deltaFHz)} (negative = slowing)${partialRoiNote(task.roiUsage)}`,
    ],
    ['95 % CI of mean Δf', task.ciHz === null ? 'not available' : formatCiHz(task.ciHz)],
    ['Wilcoxon signed-rank p', task.pValue === null ? 'not available' : formatPValue(task.pValue)],
    ['Trials', trials],
    ['Band', formatQuantityRange(task.bandHz, 'frequencyHz')],
    [
      'Windows',
      `baseline ${windowWords(task.baselineWindowS)}, post ${windowWords(task.postWindowS)}`,
    ],
  ]);
  drawBasis(
    canvas,
    task,
    'Instantaneous frequency from the phase of the analytic signal, median-filtered, averaged ' +
      'over the region of interest; confidence interval by bootstrap over trials (2000 resamples).',
  );
  drawOnsetCurvePlot(canvas, task);
}

/**
 * What the numbers rest on, right below them: which channels (amber when some were left out),
 * which recording, and how they were computed (`method`).
 */
function drawBasis(
  canvas: ReportCanvas,
  { roiUsage, source }: { roiUsage: RoiUsageView; source: RecordingSource },
  method: string,
): void {
  canvas.gap(2);
  canvas.paragraph(roiUsageWords(roiUsage), {
    sizePt: 9,
    color: roiUsage.status === 'complete' ? REPORT_COLORS.ink : REPORT_COLORS.amber,
  });
  canvas.gap(1);
  canvas.paragraph(sourceWords(source), { sizePt: 9, color: REPORT_COLORS.muted });
  canvas.gap(3);
  canvas.paragraph(method, { sizePt: 8, color: REPORT_COLORS.muted });
}

/**
 * A result section's heading, then, when it has no numbers to print, why: no result of its
 * kind, or no region-of-interest channel left (the reasons in the warning colour, and the
 * recording; no number or plot at all). True when its numbers follow.
 */
function opensWithNumbers<S extends { roiUsage: RoiUsageView; source: RecordingSource }>(
  canvas: ReportCanvas,
  heading: string,
  section: S | null,
  words: { kind: string; measure: string },
): section is S {
  canvas.heading(heading);
  if (section === null) {
    canvas.paragraph(`No ${words.kind} result for this visit.`, { color: REPORT_COLORS.muted });
    return false;
  }
  if (section.roiUsage.status !== 'none') return true;
  canvas.paragraph(noRoiWords(section.roiUsage, words.measure), {
    role: 'medium',
    color: REPORT_COLORS.amber,
  });
  canvas.gap(2);
  canvas.paragraph(sourceWords(section.source, false), { sizePt: 9, color: REPORT_COLORS.muted });
  return false;
}

/** A window relative to onset, signed as on screen: `−0.5 to 0.0 s`, `+0.2 to +0.8 s`. */
function windowWords(window: [number, number]): string {
  return formatQuantityRange(window, 'timeFromOnsetS');
}

function drawQuality(canvas: ReportCanvas, model: VisitReportModel): void {
  canvas.heading('Quality checks');
  if (model.quality.length === 0) {
    canvas.paragraph('No recording of this visit has been analysed.', {
      color: REPORT_COLORS.muted,
    });
    return;
  }
  for (const section of model.quality) {
    canvas.ensureSpace(40);
    canvas.paragraph(kindName(section.kind), { role: 'medium' });
    canvas.gap(2);
    for (const sentence of qualitySentences(section)) {
      canvas.paragraph(`•  ${sentence}`, { indentPt: 8 });
      canvas.gap(1);
    }
    canvas.gap(4);
  }
}

function drawFlags(canvas: ReportCanvas, model: VisitReportModel): void {
  canvas.heading('Slowing flag');
  const line = suggestionLine(model);
  if (line !== null) {
    canvas.paragraph(line.text, { color: line.color, sizePt: 9 });
    canvas.gap(4);
  }
  if (model.flags.length === 0) {
    canvas.paragraph('No slowing flag has been raised for this visit.');
    return;
  }
  for (const flag of model.flags) drawFlag(canvas, flag);
}

/** What the computation suggests, or why it suggests nothing; null when there is no task. */
function suggestionLine(model: VisitReportModel): { text: string; color: string } | null {
  const suggestion = model.flagSuggestion;
  const usage = model.task?.roiUsage ?? null;
  const ruleNote = suggestion === null ? '' : ` (rule: ${flagRule(suggestion)})`;
  // Checked first: a suggestion stored as false must not read as "no slowing" without a Δf.
  if (usage?.status === 'none') {
    return {
      text: `No suggestion: no region-of-interest channel remains${ruleNote}.`,
      color: REPORT_COLORS.amber,
    };
  }
  if (suggestion === null) return null;
  if (suggestion.suggestsSlowing === null) {
    return {
      text: `No suggestion: the computation gave no Δf to apply the rule to${ruleNote}.`,
      color: REPORT_COLORS.muted,
    };
  }
  const text = suggestion.suggestsSlowing
    ? `The computation suggests a slowing flag (${flagRule(suggestion)}). Only an analyst ` +
      'raises a flag.'
    : `The computation does not suggest a slowing flag${ruleNote}.`;
  if (usage?.status !== 'partial') return { text, color: REPORT_COLORS.muted };
  // The suggestion is only as good as the channels behind it: say so beside it.
  return {
    text:
      `${text} It rests on ${usage.used.length} of ${usage.wanted.length} ` +
      'region-of-interest channels (see Task).',
    color: REPORT_COLORS.amber,
  };
}

function flagRule(suggestion: FlagSuggestionEntry): string {
  return `Δf at or below ${formatDeltaHz(suggestion.flagThresholdHz)} and the 95 % CI excluding 0`;
}

function drawFlag(canvas: ReportCanvas, flag: FlagEntry): void {
  canvas.ensureSpace(60);
  const color = flag.state === 'raised' ? REPORT_COLORS.amber : REPORT_COLORS.muted;
  canvas.paragraph(flag.state === 'raised' ? 'Flag raised' : 'Flag cleared', {
    role: 'bold',
    color,
  });
  const rows: Array<[string, string]> = [
    ['Raised by', `${flag.raisedByName}, ${formatUtc(flag.raisedAtIso)}`],
    ['Reason', flag.raiseReason],
  ];
  if (flag.state === 'cleared') {
    rows.push([
      'Cleared by',
      `${flag.clearedByName ?? 'unknown'}, ${flag.clearedAtIso === null ? 'unknown time' : formatUtc(flag.clearedAtIso)}`,
    ]);
    rows.push(['Reason for clearing', flag.clearReason ?? '']);
  }
  canvas.facts(rows);
  canvas.gap(4);
}

function drawProvenance(canvas: ReportCanvas, model: VisitReportModel): void {
  canvas.heading('Provenance');
  if (model.provenance.length === 0) {
    canvas.paragraph('No analysis run.', { color: REPORT_COLORS.muted });
    return;
  }
  for (const entry of model.provenance) {
    canvas.ensureSpace(110);
    canvas.paragraph(kindName(entry.kind), { role: 'medium' });
    canvas.facts([
      ['Analysis run', entry.analysisRunId, 'mono'],
      ['Settings version', String(entry.settingsVersion)],
      ['Code version', entry.codeVersion, 'mono'],
      ['Input SHA-256', entry.inputChecksumSha256, 'mono'],
      ...depthSettingsRows(entry.depthSettings),
    ]);
    canvas.gap(4);
  }
}

function drawSignature(canvas: ReportCanvas, model: VisitReportModel): void {
  canvas.ensureSpace(130);
  canvas.heading('Electronic signature');
  const { doc } = canvas;
  const top = doc.y;
  const signature = model.signature;
  if (signature === null) {
    canvas.paragraph(
      'Not signed. This draft is for review and is not part of the study record until an ' +
        'analyst signs it.',
      { role: 'medium', color: REPORT_COLORS.amber },
    );
    return;
  }
  doc.y += 8;
  canvas.facts([
    ['Signed by', signature.signerName],
    ['Date and time', formatUtc(signature.signedAtIso)],
    ['Meaning', signature.meaning],
  ]);
  canvas.gap(2);
  canvas.paragraph(
    'Signed electronically in Gyre: the signer re-entered their password and confirmed the ' +
      'meaning above (21 CFR Part 11 §11.50, §11.200). A signed revision never changes; later ' +
      'results or flag changes make a new revision.',
    { sizePt: 8, color: REPORT_COLORS.muted, indentPt: 8, widthPt: BODY_WIDTH_PT - 16 },
  );
  const bottom = doc.y + 6;
  doc
    .rect(PAGE.marginLeftPt - 8, top, BODY_WIDTH_PT + 16, bottom - top)
    .lineWidth(1)
    .strokeColor(REPORT_COLORS.primary)
    .stroke();
  doc.y = bottom;
}

/** Running header, caution, page number and (for drafts) a watermark on every page. */
function drawPageFurniture(canvas: ReportCanvas, model: VisitReportModel): void {
  const { doc } = canvas;
  const range = doc.bufferedPageRange();
  const header = `Gyre visit report · ${model.participantCode} · ${model.visit.label} · revision ${model.revision}`;
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    // Writing in the margins must not start new pages.
    const margins = doc.page.margins;
    doc.page.margins = { ...margins, top: 0, bottom: 0 };

    if (model.signature === null) {
      doc.save();
      doc.rotate(-40, { origin: [PAGE.widthPt / 2, PAGE.heightPt / 2] });
      doc.fillOpacity(0.07);
      canvas.textAt('DRAFT · NOT SIGNED', PAGE.widthPt / 2 - 250, PAGE.heightPt / 2 - 30, {
        role: 'bold',
        sizePt: 56,
        color: REPORT_COLORS.amber,
      });
      doc.restore();
    }

    const headerY = 30;
    const small = { sizePt: 8, color: REPORT_COLORS.muted } as const;
    canvas.textAt(header, PAGE.marginLeftPt, headerY, small);
    canvas.textAt(stateLabel(model), PAGE.marginLeftPt + BODY_WIDTH_PT, headerY, {
      ...small,
      role: 'medium',
      color: model.signature === null ? REPORT_COLORS.amber : REPORT_COLORS.primary,
      alignRight: true,
    });
    doc
      .moveTo(PAGE.marginLeftPt, headerY + 13)
      .lineTo(PAGE.marginLeftPt + BODY_WIDTH_PT, headerY + 13)
      .lineWidth(0.5)
      .strokeColor(REPORT_COLORS.line)
      .stroke();

    const footerY = PAGE.heightPt - PAGE.marginBottomPt + 30;
    doc
      .moveTo(PAGE.marginLeftPt, footerY - 8)
      .lineTo(PAGE.marginLeftPt + BODY_WIDTH_PT, footerY - 8)
      .lineWidth(0.5)
      .strokeColor(REPORT_COLORS.line)
      .stroke();
    canvas.textAt(RESEARCH_CAUTION, PAGE.marginLeftPt, footerY, {
      sizePt: 8,
      role: 'medium',
      color: REPORT_COLORS.amber,
      widthPt: BODY_WIDTH_PT - 90,
    });
    const pageText = `Page ${i - range.start + 1} of ${range.count}`;
    canvas.textAt(pageText, PAGE.marginLeftPt + BODY_WIDTH_PT, footerY, {
      sizePt: 8,
      color: REPORT_COLORS.muted,
      alignRight: true,
    });
    doc.page.margins = margins;
  }
}
