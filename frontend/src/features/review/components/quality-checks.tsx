import type { QualityView, RoiUsageView } from '@gyre/shared';
import { Alert, Flex, Table, Tag } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { ChannelQualityTable } from './channel-quality-table';
import { qualityFindings, type QualityFinding } from './quality-findings';
import { formatCount } from '../../../lib/format';

/** The quality checks of one recording, with warnings in plain words. */
export function QualityChecks({
  quality,
  kind,
  roiUsage,
  lineFrequencyHz = null,
}: {
  quality: QualityView;
  kind: 'task' | 'resting';
  roiUsage?: RoiUsageView;
  /** The power line frequency the recording's source declared: only that check applies. */
  lineFrequencyHz?: 50 | 60 | null;
}) {
  const findings = qualityFindings(quality, kind, roiUsage, lineFrequencyHz);
  const warnings = [
    ...quality.warnings,
    ...findings.flatMap((f) => (f.warning === null ? [] : [f.warning])),
  ];
  return (
    <Flex vertical gap={12}>
      {warnings.length === 0 ? (
        <Alert type="success" showIcon title="No quality warning for this recording." />
      ) : (
        <Alert
          type="warning"
          showIcon
          title={formatCount(warnings.length, 'quality warning')}
          description={
            <ul className="gyre-compact-list">
              {warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          }
        />
      )}
      <Table<QualityFinding>
        aria-label={`Quality checks, ${kind === 'task' ? 'task' : 'resting'} recording`}
        size="small"
        rowKey="check"
        pagination={false}
        showHeader={false}
        dataSource={findings}
        columns={[
          { key: 'check', dataIndex: 'check', width: '45%' },
          {
            key: 'value',
            render: (_, row) =>
              row.warning === null ? (
                row.value
              ) : (
                <span>
                  <Tag color={GYRE_COLORS.amberText}>check</Tag>
                  {row.value}
                </span>
              ),
          },
        ]}
      />
      <ChannelQualityTable
        channels={quality.channels}
        lineFrequencyHz={lineFrequencyHz}
        label={`Channel checks, ${kind === 'task' ? 'task' : 'resting'} recording`}
      />
    </Flex>
  );
}
