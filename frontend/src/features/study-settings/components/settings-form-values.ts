import type { AnalysisSettingsChange, AnalysisSettingsValues } from '@gyre/shared';

/** The settings form's fields: one number per input, so each gets its own message. */
export interface SettingsFormValues {
  bandMode: 'auto' | 'fixed';
  bandLowHz: number | null;
  bandHighHz: number | null;
  method: 'filter' | 'morlet';
  morletCycles: number | null;
  epochStartS: number | null;
  epochEndS: number | null;
  baselineStartS: number | null;
  baselineEndS: number | null;
  postStartS: number | null;
  postEndS: number | null;
  rejectionThresholdUv: number | null;
  flagThresholdHz: number | null;
  roi: string[];
  onsetLabel: string;
  amplitudeGateOn: boolean;
  /** Kept while the gate is off, so switching it back on shows the last percentile. */
  amplitudeGatePercentile: number | null;
  cycleDisagreementHz: number | null;
  /** The two conditions compared: both empty = the first two found. */
  compareFirst: string;
  compareSecond: string;
  reason: string;
}

export const REASON_MIN_LENGTH = 10;

export function formValuesOf(settings: AnalysisSettingsValues): SettingsFormValues {
  return {
    bandMode: settings.bandHz === null ? 'auto' : 'fixed',
    bandLowHz: settings.bandHz?.[0] ?? 8,
    bandHighHz: settings.bandHz?.[1] ?? 13,
    method: settings.method,
    morletCycles: settings.morletCycles,
    epochStartS: settings.epochWindowS[0],
    epochEndS: settings.epochWindowS[1],
    baselineStartS: settings.baselineWindowS[0],
    baselineEndS: settings.baselineWindowS[1],
    postStartS: settings.postWindowS[0],
    postEndS: settings.postWindowS[1],
    rejectionThresholdUv: settings.rejectionThresholdUv,
    flagThresholdHz: settings.flagThresholdHz,
    roi: settings.roi,
    onsetLabel: settings.onsetLabel ?? '',
    amplitudeGateOn: settings.amplitudeGatePercentile !== null,
    amplitudeGatePercentile: settings.amplitudeGatePercentile,
    cycleDisagreementHz: settings.cycleDisagreementHz,
    compareFirst: settings.compareConditions?.[0] ?? '',
    compareSecond: settings.compareConditions?.[1] ?? '',
    reason: '',
  };
}

const num = (value: number | null, field: string): number => {
  if (value === null || !Number.isFinite(value)) throw new Error(`${field} is empty`);
  return value;
};

/** The change to send; call only after the form validated, so every number is present. */
export function changeOf(values: SettingsFormValues): AnalysisSettingsChange {
  return {
    bandHz:
      values.bandMode === 'auto'
        ? null
        : [num(values.bandLowHz, 'bandLowHz'), num(values.bandHighHz, 'bandHighHz')],
    method: values.method,
    morletCycles: num(values.morletCycles, 'morletCycles'),
    epochWindowS: [num(values.epochStartS, 'epochStartS'), num(values.epochEndS, 'epochEndS')],
    baselineWindowS: [
      num(values.baselineStartS, 'baselineStartS'),
      num(values.baselineEndS, 'baselineEndS'),
    ],
    postWindowS: [num(values.postStartS, 'postStartS'), num(values.postEndS, 'postEndS')],
    rejectionThresholdUv: num(values.rejectionThresholdUv, 'rejectionThresholdUv'),
    flagThresholdHz: num(values.flagThresholdHz, 'flagThresholdHz'),
    roi: values.roi,
    onsetLabel: values.onsetLabel.trim() === '' ? null : values.onsetLabel.trim(),
    amplitudeGatePercentile: values.amplitudeGateOn
      ? num(values.amplitudeGatePercentile, 'amplitudeGatePercentile')
      : null,
    cycleDisagreementHz: num(values.cycleDisagreementHz, 'cycleDisagreementHz'),
    compareConditions: comparedPairOf(values.compareFirst, values.compareSecond),
    reason: values.reason.trim(),
  };
}

/** Both labels trimmed, or null when both are empty (the form checks "both or neither"). */
function comparedPairOf(first: string, second: string): [string, string] | null {
  const pair: [string, string] = [first.trim(), second.trim()];
  return pair[0] === '' && pair[1] === '' ? null : pair;
}
