import type { RoiUsageView } from '@gyre/shared';
import { ROI_OMISSION_WORDS } from './report-wording';
import { RecordingSource, VisitReportModel } from './visit-report-model';

/** A report model that cannot be drawn faithfully; names the field, what was found and expected. */
export class ReportModelError extends Error {
  constructor(
    readonly field: string,
    readonly found: string,
    readonly expected: string,
  ) {
    super(`Report field ${field}: found ${found}, expected ${expected}.`);
    this.name = 'ReportModelError';
  }
}

/**
 * Checks what the renderer relies on, so that a wrong model fails loudly instead of drawing
 * a plot that misstates the numbers (series of unequal length, non-finite headline values,
 * a number beside a region of interest that has no channel left).
 */
export function assertValidModel(model: VisitReportModel): void {
  requireText('participantCode', model.participantCode);
  requireText('visit.label', model.visit.label);
  if (!/^\d{4}-\d{2}-\d{2}$/.test(model.visit.date)) {
    throw new ReportModelError('visit.date', JSON.stringify(model.visit.date), 'YYYY-MM-DD');
  }
  requireIso('generatedAtIso', model.generatedAtIso);
  if (!Number.isInteger(model.revision) || model.revision < 1) {
    throw new ReportModelError('revision', String(model.revision), 'an integer ≥ 1');
  }
  if (model.rest !== null) {
    const { frequencyHz, powerUv2PerHz } = model.rest.spectrum;
    sameLength('rest.spectrum.powerUv2PerHz', powerUv2PerHz.length, frequencyHz.length);
    const { pafHz, cogHz, prominenceDb } = model.rest;
    checkHeadlines('rest', model.rest, { pafHz, cogHz, prominenceDb });
  }
  if (model.task !== null) {
    const curve = model.task.onsetCurve;
    sameLength('task.onsetCurve.meanHz', curve.meanHz.length, curve.timeS.length);
    sameLength('task.onsetCurve.ciLowHz', curve.ciLowHz.length, curve.timeS.length);
    sameLength('task.onsetCurve.ciHighHz', curve.ciHighHz.length, curve.timeS.length);
    const { deltaFHz, ciHz, pValue } = model.task;
    checkHeadlines('task', model.task, { deltaFHz, ciHz, pValue });
  }
  if (model.flagSuggestion !== null) {
    optionalFinite('flagSuggestion.flagThresholdHz', model.flagSuggestion.flagThresholdHz);
    if (model.flagSuggestion.suggestsSlowing === true && model.task?.roiUsage.status === 'none') {
      throw new ReportModelError(
        'flagSuggestion.suggestsSlowing',
        'true',
        'null or false when no region-of-interest channel of the task remains',
      );
    }
  }
  if (model.signature !== null) {
    requireText('signature.signerName', model.signature.signerName);
    requireText('signature.meaning', model.signature.meaning);
    requireIso('signature.signedAtIso', model.signature.signedAtIso);
  }
}

/**
 * A section's headline numbers: each finite or null (a pair checked number by number), its
 * region of interest and source, and every number null when no region-of-interest channel
 * remains.
 */
function checkHeadlines(
  section: 'rest' | 'task',
  of: { roiUsage: RoiUsageView; source: RecordingSource },
  values: Record<string, number | readonly number[] | null>,
): void {
  for (const [name, value] of Object.entries(values)) {
    if (Array.isArray(value))
      value.forEach((v, i) => optionalFinite(`${section}.${name}[${i}]`, v));
    else optionalFinite(`${section}.${name}`, value as number | null);
  }
  checkRoiUsage(`${section}.roiUsage`, of.roiUsage);
  checkSource(`${section}.source`, of.source);
  if (of.roiUsage.status === 'none') {
    for (const [name, value] of Object.entries(values)) nullWithoutRoi(`${section}.${name}`, value);
  }
}

const STATUSES: ReadonlyArray<RoiUsageView['status']> = ['complete', 'partial', 'none'];

/** The printed "n of m wanted" and the status must agree with the channel lists. */
function checkRoiUsage(field: string, usage: RoiUsageView): void {
  if (!STATUSES.includes(usage.status)) {
    throw new ReportModelError(
      `${field}.status`,
      JSON.stringify(usage.status),
      STATUSES.join(', '),
    );
  }
  usage.leftOut.forEach((omission, i) => {
    if (!Object.hasOwn(ROI_OMISSION_WORDS, omission.reason)) {
      throw new ReportModelError(
        `${field}.leftOut[${i}].reason`,
        JSON.stringify(omission.reason),
        Object.keys(ROI_OMISSION_WORDS).join(', '),
      );
    }
  });
  const accounted = usage.used.length + usage.leftOut.length;
  if (accounted !== usage.wanted.length) {
    throw new ReportModelError(
      field,
      `${usage.used.length} used and ${usage.leftOut.length} left out`,
      `together the ${usage.wanted.length} wanted channels`,
    );
  }
  // Names of the default set that the montage lacks ('missing') may leave a region complete:
  // the default means "those present" (docs/method.md §1); any other reason makes it partial.
  const onlyMissing = usage.leftOut.every((omission) => omission.reason === 'missing');
  const expected =
    usage.used.length === 0
      ? 'none'
      : usage.leftOut.length === 0
        ? 'complete'
        : onlyMissing && usage.status === 'complete'
          ? 'complete'
          : 'partial';
  if (usage.status !== expected) {
    throw new ReportModelError(
      `${field}.status`,
      JSON.stringify(usage.status),
      `"${expected}" for ${usage.used.length} used and ${usage.leftOut.length} left out`,
    );
  }
}

function checkSource(field: string, source: RecordingSource): void {
  requireText(`${field}.recordingId`, source.recordingId);
  requireIso(`${field}.uploadedAtIso`, source.uploadedAtIso);
  if (source.replacesId !== null) requireText(`${field}.replacesId`, source.replacesId);
  if (source.replacesId === null && source.replacementReason !== null) {
    throw new ReportModelError(
      `${field}.replacementReason`,
      JSON.stringify(source.replacementReason),
      'null when no recording is replaced',
    );
  }
}

/** A number that rests on no channel cannot be right, so it is not printed silently. */
function nullWithoutRoi(field: string, value: unknown): void {
  if (value !== null) {
    throw new ReportModelError(
      field,
      JSON.stringify(value),
      'null when no region-of-interest channel remains',
    );
  }
}

function requireText(field: string, value: string): void {
  if (value.trim() === '') throw new ReportModelError(field, 'an empty string', 'text');
}

function requireIso(field: string, value: string): void {
  if (Number.isNaN(Date.parse(value))) {
    throw new ReportModelError(field, JSON.stringify(value), 'an ISO 8601 date-time');
  }
}

function sameLength(field: string, found: number, expected: number): void {
  if (found !== expected) {
    throw new ReportModelError(
      field,
      `${found} values`,
      `${expected} (one per point of the x axis)`,
    );
  }
}

function optionalFinite(field: string, value: number | null): void {
  if (value !== null && !Number.isFinite(value)) {
    throw new ReportModelError(field, String(value), 'a finite number or null');
  }
}
