import { VisitReportModel } from './visit-report-model';

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
 * a plot that misstates the numbers (series of unequal length, non-finite headline values).
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
  }
  if (model.task !== null) {
    const curve = model.task.onsetCurve;
    sameLength('task.onsetCurve.meanHz', curve.meanHz.length, curve.timeS.length);
    sameLength('task.onsetCurve.ciLowHz', curve.ciLowHz.length, curve.timeS.length);
    sameLength('task.onsetCurve.ciHighHz', curve.ciHighHz.length, curve.timeS.length);
    optionalFinite('task.deltaFHz', model.task.deltaFHz);
    optionalFinite('task.pValue', model.task.pValue);
  }
  if (model.signature !== null) {
    requireText('signature.signerName', model.signature.signerName);
    requireText('signature.meaning', model.signature.meaning);
    requireIso('signature.signedAtIso', model.signature.signedAtIso);
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
