import type { ChannelStatsDto } from '@gyre/shared';
import { Table, Tag } from 'antd';
import type { TableColumnsType } from 'antd';
import { formatHz } from '../../../lib/format';

/** p-values to three decimals, and "< 0.001" below that (common practice in reporting). */
export function formatPValue(value: number | null): string {
  if (value === null || !Number.isFinite(value)) return '—';
  return value < 0.001 ? '< 0.001' : value.toFixed(3);
}

export function formatCi(ci: [number, number] | null): string {
  return ci === null ? '—' : `${ci[0].toFixed(2)} to ${ci[1].toFixed(2)} Hz`;
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

/** Per-channel onset results of the task recording; every column sorts. */
export function ChannelTable({ channels }: { channels: ChannelStatsDto[] }) {
  const name: TableColumnsType<ChannelStatsDto>[number] = {
    title: 'Channel',
    key: 'label',
    sorter: (a, b) => (a.canonical ?? a.label).localeCompare(b.canonical ?? b.label),
    render: (_, row) => (
      <span>
        {row.canonical ?? row.label}
        {row.canonical !== null && row.canonical !== row.label ? (
          <span style={{ color: 'rgba(29,43,47,0.55)', marginLeft: 6 }}>({row.label})</span>
        ) : null}
        {row.inRoi ? (
          <Tag color="#24525A" style={{ marginLeft: 8 }}>
            ROI
          </Tag>
        ) : null}
      </span>
    ),
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
    <Table<ChannelStatsDto>
      aria-label="Per-channel task results"
      rowKey="label"
      size="small"
      columns={columns}
      dataSource={channels}
      pagination={channels.length > 20 ? { pageSize: 20, showSizeChanger: false } : false}
      showSorterTooltip={false}
      locale={{ emptyText: 'No channel results.' }}
    />
  );
}
