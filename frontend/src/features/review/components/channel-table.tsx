import type { ChannelStatsView, RoiUsageView } from '@gyre/shared';
import { Alert, Table, Tag } from 'antd';
import type { TableColumnsType } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { numberColumn } from '../../../components/number-column';
import { formatDeltaHzRange, formatHz, formatPValue } from '../../../lib/format';
import {
  NO_ROI_CHANNEL_REMAINS,
  leftOutText,
  omissionOf,
  omissionWords,
  roiUsageSentence,
  usedInRoi,
} from '../../../lib/roi-usage';
import { AmplitudeGateNote, amplitudeGateColumn, gatePercentileOf } from './amplitude-gate';

export function formatCi(ci: [number, number] | null): string {
  return formatDeltaHzRange(ci);
}

/** Which region-of-interest channels the numbers come from, above the table. */
function RoiCaption({ usage }: { usage: RoiUsageView }) {
  if (usage.status === 'complete') return null;
  return (
    <Alert
      type="warning"
      showIcon
      className="gyre-below-sm"
      aria-label="Region of interest of this table"
      title={
        usage.status === 'none'
          ? `${NO_ROI_CHANNEL_REMAINS}: no channel below is averaged into a region-of-interest result.`
          : roiUsageSentence(usage)
      }
      description={
        usage.status === 'none' && usage.leftOut.length > 0
          ? `Left out: ${leftOutText(usage.leftOut)}.`
          : undefined
      }
    />
  );
}

/**
 * Per-channel onset results of the task recording; every column sorts. The ROI badge marks
 * only the channels the run averaged; a region channel it left out says why.
 */
export function ChannelTable({
  channels,
  roiUsage,
}: {
  channels: ChannelStatsView[];
  roiUsage: RoiUsageView;
}) {
  const name: TableColumnsType<ChannelStatsView>[number] = {
    title: 'Channel',
    key: 'label',
    sorter: (a, b) => (a.canonical ?? a.label).localeCompare(b.canonical ?? b.label),
    render: (_, row) => {
      const omission = omissionOf(roiUsage, row.label, row.canonical);
      return (
        <span>
          {row.canonical ?? row.label}
          {row.canonical !== null && row.canonical !== row.label ? (
            <span style={{ color: GYRE_COLORS.inkSoft, marginLeft: 6 }}>({row.label})</span>
          ) : null}
          {usedInRoi(roiUsage, row.label, row.canonical) ? (
            <Tag color={GYRE_COLORS.primary} className="gyre-review-beside">
              ROI
            </Tag>
          ) : omission !== null ? (
            <Tag color={GYRE_COLORS.amberText} className="gyre-review-beside">
              left out of ROI: {omissionWords(omission.reason)}
            </Tag>
          ) : null}
        </span>
      );
    },
  };
  const hzColumn = (
    title: string,
    key: keyof ChannelStatsView,
    pick: (row: ChannelStatsView) => number | null,
    defaultSortOrder?: 'ascend',
  ) => numberColumn(title, key, pick, (row) => formatHz(pick(row)), defaultSortOrder);
  const columns: TableColumnsType<ChannelStatsView> = [
    name,
    hzColumn('Baseline', 'baselineHz', (r) => r.baselineHz),
    hzColumn('Post', 'postHz', (r) => r.postHz),
    hzColumn('Δf', 'deltaFHz', (r) => r.deltaFHz, 'ascend'),
    numberColumn(
      '95 % CI of Δf',
      'ciHz',
      (r) => r.ciHz?.[0] ?? null,
      (row) => formatCi(row.ciHz),
    ),
    numberColumn(
      'p (Wilcoxon)',
      'pValue',
      (r) => r.pValue,
      (row) => formatPValue(row.pValue),
    ),
    numberColumn(
      'Trials kept',
      'trials',
      (r) => r.trials,
      (row) => (row.trials === null ? '—' : String(row.trials)),
    ),
  ];
  const gatePercentile = gatePercentileOf(channels);
  if (gatePercentile !== null) columns.push(amplitudeGateColumn());
  return (
    <>
      <RoiCaption usage={roiUsage} />
      {gatePercentile !== null && <AmplitudeGateNote percentile={gatePercentile} />}
      <Table<ChannelStatsView>
        aria-label="Per-channel task results"
        rowKey="label"
        size="small"
        columns={columns}
        dataSource={channels}
        pagination={channels.length > 20 ? { pageSize: 20, showSizeChanger: false } : false}
        showSorterTooltip={false}
        // Seven columns do not fit a phone: the table scrolls sideways instead of squeezing.
        scroll={{ x: 'max-content' }}
        locale={{ emptyText: 'No channel results.' }}
      />
    </>
  );
}
