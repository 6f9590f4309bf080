import type { RoiUsageDto } from '@gyre/shared';
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
    optionalFinite('rest.pafHz', model.rest.pafHz);
    optionalFinite('rest.cogHz', model.rest.cogHz);
    optionalFinite('rest.prominenceDb', model.rest.prominenceDb);
    checkRoiUsage('rest.roiUsage', model.rest.roiUsage);
    checkSource('rest.source', model.rest.source);
    if (model.rest.roiUsage.status === 'none') {
      nullWithoutRoi('rest.pafHz', model.rest.pafHz);
      nullWithoutRoi('rest.cogHz', model.rest.cogHz);
      nullWithoutRoi('rest.prominenceDb', model.rest.prominenceDb);
    }
  }
  if (model.task !== null) {
    const curve = model.task.onsetCurve;
    sameLength('task.onsetCurve.meanHz', curve.meanHz.length, curve.timeS.length);
    sameLength('task.onsetCurve.ciLowHz', curve.ciLowHz.length, curve.timeS.length);
    sameLength('task.onsetCurve.ciHighHz', curve.ciHighHz.length, curve.timeS.length);
    optionalFinite('task.deltaFHz', model.task.deltaFHz);
    optionalFinite('task.ciHz[0]', model.task.ciHz?.[0] ?? null);
    optionalFinite('task.ciHz[1]', model.task.ciHz?.[1] ?? null);
    optionalFinite('task.pValue', model.task.pValue);
    checkRoiUsage('task.roiUsage', model.task.roiUsage);
    checkSource('task.source', model.task.source);
    if (model.task.roiUsage.status === 'none') {
      nullWithoutRoi('task.deltaFHz', model.task.deltaFHz);
      nullWithoutRoi('task.ciHz', model.task.ciHz);
      nullWithoutRoi('task.pValue', model.task.pValue);
    }
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

const STATUSES: ReadonlyArray<RoiUsageDto['status']> = ['complete', 'partial', 'none'];

/** The printed "n of m wanted" and the status must agree with the channel lists. */
function checkRoiUsage(field: string, usage: RoiUsageDto): void {
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
