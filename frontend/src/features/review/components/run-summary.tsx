import type { AnalysisRunView } from '@gyre/shared';
import { Descriptions, Tag, Typography } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { formatHz, formatHzRange, formatPValue } from '../../../lib/format';
import { NO_ROI_CHANNEL_REMAINS } from '../../../lib/roi-usage';
import { formatCi } from './channel-table';
import { TRIGGER_WORDS } from './run-words';
import { useVisitTime } from './visit-time';

const BAND_SOURCE: Record<AnalysisRunView['bandSource'], string> = {
  settings: 'study setting',
  iaf: "visit's resting IAF ± 2 Hz",
  default: 'default 8–13 Hz',
};

/** The ROI Δf, never without saying when its region is incomplete or empty. */
function RoiDeltaF({ run }: { run: AnalysisRunView }) {
  if (run.roiUsage.status === 'none') {
    return (
      <Typography.Text data-testid="roi-delta-f" style={{ color: GYRE_COLORS.amberText }}>
        — ({NO_ROI_CHANNEL_REMAINS})
      </Typography.Text>
    );
  }
  return (
    <span data-testid="roi-delta-f">
      {formatHz(run.roiDeltaFHz)}
      {run.roiUsage.status === 'partial' && (
        <Tag color={GYRE_COLORS.amberText} className="gyre-review-beside">
          from {run.roiUsage.used.join(', ')} only
        </Tag>
      )}
    </span>
  );
}

/** The headline numbers of a run, and the settings they were computed with. */
export function RunSummary({ run }: { run: AnalysisRunView }) {
  const visitTime = useVisitTime();
  const band = `${formatHzRange(run.bandHz)} (${BAND_SOURCE[run.bandSource]})`;
  const items =
    run.kind === 'task'
      ? [
          { key: 'df', label: 'ROI Δf', children: <RoiDeltaF run={run} /> },
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
            <>
              <Tag data-testid={`settings-version-${run.kind}`}>version {run.settingsVersion}</Tag>
              {run.overrideRevision !== null && (
                <Tag color={GYRE_COLORS.primary}>
                  visit choices, revision {run.overrideRevision}
                </Tag>
              )}
            </>
          ),
        },
        {
          key: 'computed',
          label: 'Computed',
          children: `${visitTime(run.createdAt)}, ${TRIGGER_WORDS[run.trigger]}`,
        },
      ]}
    />
  );
}
