import type { AnalysisSettingsView, VisitAnalysisOverrideView } from '@gyre/shared';
import { Button, Descriptions, Flex, Typography } from 'antd';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { formatHzRange } from '../../../lib/format';
import { useVisitTime } from './visit-time';

const bandText = (band: [number, number] | null) =>
  band === null ? "visit's IAF ± 2 Hz (8–13 Hz without one)" : formatHzRange(band);

/**
 * The visit's own analysis choices (or that it follows the study's settings), the way to
 * change them for those who may, and where the study-wide settings are.
 */
export function OverrideCard({
  override,
  study,
  canChange,
  onChange,
}: {
  override: VisitAnalysisOverrideView;
  study: AnalysisSettingsView | undefined;
  canChange: boolean;
  onChange: () => void;
}) {
  const formatTime = useVisitTime();
  const studyNote = study === undefined ? '' : ` (version ${study.version})`;
  return (
    <Flex vertical gap={12}>
      {override.revision === 0 ? (
        <Typography.Text>
          This visit uses the study&apos;s settings{studyNote}: no choices of its own.
        </Typography.Text>
      ) : (
        <Descriptions
          size="small"
          column={1}
          className="gyre-figures"
          items={[
            {
              key: 'roi',
              label: 'Region of interest',
              children:
                override.roi === null
                  ? `the study's${study === undefined ? '' : `: ${study.roi.join(', ')}`}`
                  : override.roi.join(', '),
            },
            {
              key: 'band',
              label: 'Band',
              children:
                override.bandHz === null
                  ? `the study's${study === undefined ? '' : `: ${bandText(study.bandHz)}`}`
                  : bandText(override.bandHz),
            },
            {
              key: 'onsets',
              label: 'Onsets',
              children: override.onsetLabel === null ? "the study's" : `“${override.onsetLabel}”`,
            },
            {
              key: 'revision',
              label: 'Revision',
              children: `${override.revision}, ${formatTime(override.updatedAt)}`,
            },
            { key: 'reason', label: 'Why', children: override.reason ?? '—' },
          ]}
        />
      )}
      {canChange && (
        <div>
          <Button onClick={onChange}>Change this visit&apos;s choices</Button>
        </div>
      )}
      <Typography.Text type="secondary">
        The study-wide settings and their versions are on{' '}
        <Link to={paths.studySettings}>Study settings</Link>.
      </Typography.Text>
    </Flex>
  );
}
