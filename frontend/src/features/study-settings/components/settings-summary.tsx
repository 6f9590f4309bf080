import { ANALYSIS_SETTINGS_FIELDS, type AnalysisSettingsView } from '@gyre/shared';
import { Descriptions } from 'antd';
import { SETTING_NAMES, settingValueText } from './settings-words';

/** The settings of one version, each with its unit. */
export function SettingsSummary({ settings }: { settings: AnalysisSettingsView }) {
  return (
    <Descriptions
      size="small"
      column={{ xs: 1, md: 2 }}
      className="gyre-figures"
      items={[
        { key: 'version', label: 'Version', children: String(settings.version) },
        ...ANALYSIS_SETTINGS_FIELDS.filter(
          (field) => field !== 'morletCycles' || settings.method === 'morlet',
        ).map((field) => ({
          key: field,
          label: SETTING_NAMES[field],
          children: settingValueText(field, settings[field]),
        })),
        { key: 'reason', label: 'Why this version', children: settings.reason },
      ]}
    />
  );
}
