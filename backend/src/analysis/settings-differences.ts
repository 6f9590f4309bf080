import {
  ANALYSIS_SETTINGS_FIELDS,
  type RecordingKind,
  type SettingsFieldChange,
} from '@gyre/shared';
import type { AnalysisSettings } from '../signal/pipeline/analysis-settings';

/** The fields a computation of this kind reads: a resting spectrum only needs its channels. */
const READ_BY_KIND: Record<RecordingKind, readonly (keyof AnalysisSettings)[]> = {
  resting: ['roi'],
  task: ANALYSIS_SETTINGS_FIELDS,
};

const NAMES: Record<keyof AnalysisSettings, string> = {
  bandHz: 'band',
  method: 'method',
  morletCycles: 'Morlet cycles',
  epochWindowS: 'epoch',
  baselineWindowS: 'baseline window',
  postWindowS: 'post window',
  rejectionThresholdUv: 'rejection threshold',
  flagThresholdHz: 'suggestion threshold',
  roi: 'region of interest',
  onsetLabel: 'onset label',
  amplitudeGatePercentile: 'amplitude gate',
  cycleDisagreementHz: 'estimate disagreement warning',
  compareConditions: 'conditions compared',
};

/** Every field whose value differs, with both values. */
export function settingsFieldChanges(
  before: AnalysisSettings,
  after: AnalysisSettings,
): SettingsFieldChange[] {
  return ANALYSIS_SETTINGS_FIELDS.filter((field) => !sameValue(before[field], after[field])).map(
    (field) => ({
      field,
      before: before[field],
      after: after[field],
    }),
  );
}

/**
 * What computing a recording of `kind` with `current` would do differently from `used`, in
 * words ("post window 0.2–0.8 s → 0.3–0.9 s"); empty when the numbers could not change.
 */
export function staleSettingsPhrases(
  kind: RecordingKind,
  used: AnalysisSettings,
  current: AnalysisSettings,
): string[] {
  return settingsFieldChanges(used, current)
    .filter((change) => READ_BY_KIND[kind].includes(change.field))
    .filter((change) => change.field !== 'morletCycles' || current.method === 'morlet')
    .map(
      (change) =>
        `${NAMES[change.field]} ${describe(change.field, change.before)} → ${describe(change.field, change.after)}`,
    );
}

/** What a null value of a field means, in words. */
const NULL_WORDS: Partial<Record<keyof AnalysisSettings, string>> = {
  bandHz: 'from the IAF',
  onsetLabel: 'every onset',
  amplitudeGatePercentile: 'off',
  compareConditions: 'the first two',
};

const UNITS: Partial<Record<keyof AnalysisSettings, string>> = {
  rejectionThresholdUv: ' µV',
  flagThresholdHz: ' Hz',
  cycleDisagreementHz: ' Hz',
};

export function sameValue(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

function describe(field: keyof AnalysisSettings, value: unknown): string {
  if (value === null) return NULL_WORDS[field] ?? 'none';
  if (Array.isArray(value) && field === 'roi') return value.join(', ');
  if (Array.isArray(value) && field === 'compareConditions') return value.join(' vs ');
  if (Array.isArray(value) && value.length === 2) {
    const unit = field === 'bandHz' ? ' Hz' : ' s';
    return `${formatNumber(value[0] as number)}–${formatNumber(value[1] as number)}${unit}`;
  }
  if (typeof value === 'number') {
    return `${field === 'amplitudeGatePercentile' ? 'percentile ' : ''}${formatNumber(value)}${UNITS[field] ?? ''}`;
  }
  return String(value);
}

/** A true minus sign for negatives, as everywhere else on Gyre's screens. */
function formatNumber(value: number): string {
  const text = String(Math.abs(value));
  return value < 0 ? `\u2212${text}` : text;
}
