import type { ChannelStatsDto, RoiUsageDto } from '@gyre/shared';
import { Alert, Table, Tag } from 'antd';
import type { TableColumnsType } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { formatDeltaHzRange, formatHz, formatPValue } from '../../../lib/format';
import {
  NO_ROI_CHANNEL_REMAINS,
  leftOutText,
  omissionOf,
  omissionWords,
  roiUsageSentence,
  usedInRoi,
} from '../../../lib/roi-usage';

export function formatCi(ci: [number, number] | null): string {
  return formatDeltaHzRange(ci);
}

/** Sorts nulls last whichever way the column is sorted by the analyst. */
function byNumber(pick: (row: ChannelStatsDto) => number | null) {
  return (a: ChannelStatsDto, b: ChannelStatsDto) => {
    const x = pick(a);
    const y = pick(b);
    if (x === null && y === null) return 0;
    if (x === null) return 1;
    if (y === null) return -1;
    return x - y;
  };
}

/** Which region-of-interest channels the numbers come from, above the table. */
function RoiCaption({ usage }: { usage: RoiUsageDto }) {
  if (usage.status === 'complete') return null;
  return (
    <Alert
      type="warning"
      showIcon
      style={{ marginBottom: 12 }}
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
  channels: ChannelStatsDto[];
  roiUsage: RoiUsageDto;
}) {
  const name: TableColumnsType<ChannelStatsDto>[number] = {
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
            <Tag color={GYRE_COLORS.primary} style={{ marginLeft: 8 }}>
              ROI
            </Tag>
          ) : omission !== null ? (
            <Tag color={GYRE_COLORS.amberText} style={{ marginLeft: 8 }}>
              left out of ROI: {omissionWords(omission.reason)}
            </Tag>
          ) : null}
        </span>
      );
    },
  };
  const hzColumn = (
    title: string,
    key: keyof ChannelStatsDto,
    pick: (row: ChannelStatsDto) => number | null,
    defaultSortOrder?: 'ascend',
  ): TableColumnsType<ChannelStatsDto>[number] => ({
    title,
    key,
    align: 'right',
    sorter: byNumber(pick),
    defaultSortOrder,
    render: (_, row) => formatHz(pick(row)),
  });
  const columns: TableColumnsType<ChannelStatsDto> = [
    name,
    hzColumn('Baseline', 'baselineHz', (r) => r.baselineHz),
    hzColumn('Post', 'postHz', (r) => r.postHz),
    hzColumn('Δf', 'deltaFHz', (r) => r.deltaFHz, 'ascend'),
    {
      title: '95 % CI of Δf',
      key: 'ciHz',
      align: 'right',
      sorter: byNumber((r) => r.ciHz?.[0] ?? null),
      render: (_, row) => formatCi(row.ciHz),
    },
    {
      title: 'p (Wilcoxon)',
      key: 'pValue',
      align: 'right',
      sorter: byNumber((r) => r.pValue),
      render: (_, row) => formatPValue(row.pValue),
    },
    {
      title: 'Trials kept',
      key: 'trials',
      align: 'right',
      sorter: byNumber((r) => r.trials),
      render: (_, row) => (row.trials === null ? '—' : String(row.trials)),
    },
  ];
  return (
    <>
      <RoiCaption usage={roiUsage} />
      <Table<ChannelStatsDto>
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
