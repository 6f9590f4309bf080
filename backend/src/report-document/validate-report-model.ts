import type { RoiUsageView } from '@gyre/shared';
import { ROI_OMISSION_WORDS } from './report-wording';
import { RecordingSource, TaskDepthSection, VisitReportModel } from './visit-report-model';

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
    if (model.task.depth !== undefined) checkDepth(model.task.depth);
  }
  model.provenance.forEach((entry, i) => {
    const field = `provenance[${i}].depthSettings`;
    checkGatePercentile(
      `${field}.amplitudeGatePercentile`,
      entry.depthSettings.amplitudeGatePercentile,
    );
    positive(`${field}.cycleDisagreementHz`, entry.depthSettings.cycleDisagreementHz);
  });
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
  finiteAll(section, values);
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

/** Conditions, their difference, the cycle-by-cycle estimate and the gate: finite or null. */
function checkDepth(depth: TaskDepthSection): void {
  depth.conditions.forEach((c, i) => {
    const field = `task.depth.conditions[${i}]`;
    requireText(`${field}.label`, c.label);
    finiteAll(field, { deltaFHz: c.deltaFHz, ciHz: c.ciHz, pValue: c.pValue });
    if (c.trialsKept > c.trialsTotal) {
      throw new ReportModelError(
        `${field}.trialsKept`,
        String(c.trialsKept),
        `at most trialsTotal (${c.trialsTotal})`,
      );
    }
  });
  const difference = depth.conditionDifference;
  if (difference !== null) {
    const field = 'task.depth.conditionDifference';
    requireText(`${field}.first`, difference.first);
    requireText(`${field}.second`, difference.second);
    finiteAll(field, {
      differenceHz: difference.differenceHz,
      ciHz: difference.ciHz,
      pValue: difference.pValue,
    });
  }
  if (depth.cycles !== null) {
    const { deltaFHz, ciHz, disagreementHz } = depth.cycles;
    finiteAll('task.depth.cycles', { deltaFHz, ciHz, disagreementHz });
  }
  positive('task.depth.cycleDisagreementHz', depth.cycleDisagreementHz);
  const gate = depth.amplitudeGate;
  if (gate !== null) {
    checkGatePercentile('task.depth.amplitudeGate.percentile', gate.percentile);
    if (!(gate.excludedSamples >= 0 && gate.excludedSamples <= gate.totalSamples)) {
      throw new ReportModelError(
        'task.depth.amplitudeGate.excludedSamples',
        String(gate.excludedSamples),
        `0 to totalSamples (${gate.totalSamples})`,
      );
    }
  }
}

function finiteAll(
  section: string,
  values: Record<string, number | readonly number[] | null>,
): void {
  for (const [name, value] of Object.entries(values)) {
    if (Array.isArray(value))
      value.forEach((v, i) => optionalFinite(`${section}.${name}[${i}]`, v));
    else optionalFinite(`${section}.${name}`, value as number | null);
  }
}

function checkGatePercentile(field: string, value: number | null): void {
  if (value !== null && !(value >= 1 && value <= 90)) {
    throw new ReportModelError(field, String(value), 'null (off) or a percentile from 1 to 90');
  }
}

function positive(field: string, value: number): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new ReportModelError(field, String(value), 'a finite number above 0');
  }
}
