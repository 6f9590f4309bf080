import type { AnalysisRunDto } from '@gyre/shared';
import { Descriptions, Tag } from 'antd';
import { formatDateTime, formatHz } from '../../../lib/format';
import { formatCi, formatPValue } from './channel-table';

const BAND_SOURCE: Record<AnalysisRunDto['bandSource'], string> = {
  settings: 'study setting',
  iaf: "visit's resting IAF ± 2 Hz",
  default: 'default 8–13 Hz',
};

/** The headline numbers of a run, and the settings version they were computed with. */
export function RunSummary({ run }: { run: AnalysisRunDto }) {
  const band = `${run.bandHz[0].toFixed(2)}–${run.bandHz[1].toFixed(2)} Hz (${BAND_SOURCE[run.bandSource]})`;
  const items =
    run.kind === 'task'
      ? [
          {
            key: 'df',
            label: 'ROI Δf',
            children: <span data-testid="roi-delta-f">{formatHz(run.roiDeltaFHz)}</span>,
          },
          { key: 'ci', label: '95 % CI', children: formatCi(run.roiCiHz) },
          { key: 'p', label: 'p (Wilcoxon)', children: formatPValue(run.roiPValue) },
          {
            key: 'trials',
            label: 'Trials',
            children:
              run.trialsKept === null ? '—' : `${run.trialsKept} kept of ${run.trialsTotal ?? '—'}`,
          },
        ]
      : // The resting numbers sit beside the spectrum, as the key to its markers.
        [];
  return (
    <Descriptions
      size="small"
      column={{ xs: 1, sm: 2, xl: 3 }}
      className="gyre-figures"
      items={[
        ...items,
        ...(run.kind === 'task' ? [{ key: 'band', label: 'Band', children: band }] : []),
        {
          key: 'version',
          label: 'Settings',
          children: (
            <Tag data-testid={`settings-version-${run.kind}`}>version {run.settingsVersion}</Tag>
          ),
        },
        { key: 'computed', label: 'Computed', children: formatDateTime(run.createdAt) },
      ]}
    />
  );
}
