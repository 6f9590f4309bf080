import type { AnalysisSettingsView, AnalysisSettingsValues } from '@gyre/shared';
import { Descriptions } from 'antd';
import { SETTING_NAMES, settingValueText } from './settings-words';

const SHOWN: (keyof AnalysisSettingsValues)[] = [
  'bandHz',
  'method',
  'morletCycles',
  'epochWindowS',
  'baselineWindowS',
  'postWindowS',
  'rejectionThresholdUv',
  'flagThresholdHz',
  'roi',
  'onsetLabel',
  'amplitudeGatePercentile',
  'cycleDisagreementHz',
  'compareConditions',
];

/** The settings of one version, each with its unit. */
export function SettingsSummary({ settings }: { settings: AnalysisSettingsView }) {
  return (
    <Descriptions
      size="small"
      column={{ xs: 1, md: 2 }}
      className="gyre-figures"
      items={[
        { key: 'version', label: 'Version', children: String(settings.version) },
        ...SHOWN.filter((field) => field !== 'morletCycles' || settings.method === 'morlet').map(
          (field) => ({
            key: field,
            label: SETTING_NAMES[field],
            children: settingValueText(field, settings[field]),
          }),
        ),
        { key: 'reason', label: 'Why this version', children: settings.reason },
      ]}
    />
  );
}
