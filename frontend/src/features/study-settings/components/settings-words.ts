import type { AnalysisSettingsValues, SettingsFieldChange } from '@gyre/shared';
import { formatHz, formatNumber } from '../../../lib/format';

type Field = keyof AnalysisSettingsValues;

/** Each setting's name as the form and the version list say it. */
export const SETTING_NAMES: Record<Field, string> = {
  bandHz: 'Alpha band',
  method: 'Narrow-band method',
  morletCycles: 'Wavelet cycles',
  epochWindowS: 'Epoch',
  baselineWindowS: 'Baseline window',
  postWindowS: 'Post window',
  rejectionThresholdUv: 'Reject epochs above',
  flagThresholdHz: 'Suggest a flag at',
  roi: 'Region of interest',
  onsetLabel: 'Onset label',
  amplitudeGatePercentile: 'Amplitude gate',
  cycleDisagreementHz: 'Warn when the estimates differ by',
  compareConditions: 'Conditions compared',
};

const isPair = (value: unknown): value is [number, number] =>
  Array.isArray(value) &&
  value.length === 2 &&
  value.every((n) => typeof n === 'number' && Number.isFinite(n));

const fixed = (value: number, decimals: number) => formatNumber(value, decimals);

/** One setting's value in words with its unit, e.g. `0.20 to 0.80 s`, `100 µV`, `Δf ≤ −0.20 Hz`. */
export function settingValueText(field: Field, value: unknown): string {
  switch (field) {
    case 'bandHz':
      if (value === null) return "visit's IAF ± 2 Hz (8–13 Hz without one)";
      return isPair(value) ? `${fixed(value[0], 2)} to ${fixed(value[1], 2)} Hz` : String(value);
    case 'method':
      return value === 'filter'
        ? 'zero-phase band-pass'
        : value === 'morlet'
          ? 'Morlet wavelet'
          : String(value);
    case 'morletCycles':
      return typeof value === 'number' ? `${value} cycles` : String(value);
    case 'epochWindowS':
    case 'baselineWindowS':
    case 'postWindowS':
      return isPair(value) ? `${fixed(value[0], 2)} to ${fixed(value[1], 2)} s` : String(value);
    case 'rejectionThresholdUv':
      return typeof value === 'number' ? `${fixed(value, 0)} µV` : String(value);
    case 'flagThresholdHz':
      return typeof value === 'number' ? `Δf ≤ ${fixed(value, 2)} Hz` : String(value);
    case 'roi':
      return Array.isArray(value) ? value.join(', ') : String(value);
    case 'onsetLabel':
      return value === null || value === '' ? 'every onset' : `“${String(value)}”`;
    case 'amplitudeGatePercentile':
      if (value === null) return 'off';
      return typeof value === 'number'
        ? `samples under percentile ${formatNumber(value, 0)} of each channel's envelope left out`
        : String(value);
    case 'cycleDisagreementHz':
      return typeof value === 'number' ? formatHz(value) : String(value);
    case 'compareConditions':
      if (value === null) return 'the first two found';
      return Array.isArray(value) && value.length === 2
        ? `“${String(value[0])}” − “${String(value[1])}”`
        : String(value);
    default:
      return JSON.stringify(value satisfies unknown);
  }
}

/** `Post window: 0.20 to 0.80 s → 0.30 to 0.90 s`. */
export function settingChangeText(change: SettingsFieldChange): string {
  const name = SETTING_NAMES[change.field] ?? change.field;
  return `${name}: ${settingValueText(change.field, change.before)} → ${settingValueText(change.field, change.after)}`;
}
