import type { ChannelQualityDto } from '@gyre/shared';
import { Table, Tag } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { formatNumber, formatShareAsPercent } from '../../../lib/format';

const ratio = (value: number | null) => formatNumber(value, 2);
const byNumber =
  (pick: (row: ChannelQualityDto) => number | null) =>
  (a: ChannelQualityDto, b: ChannelQualityDto) =>
    (pick(a) ?? Number.POSITIVE_INFINITY) - (pick(b) ?? Number.POSITIVE_INFINITY);

/** Each channel's signal checks: amplitude spread, flat or clipped signal, line noise, phase slips. */
export function ChannelQualityTable({
  channels,
  label,
}: {
  channels: ChannelQualityDto[];
  label: string;
}) {
  return (
    <Table<ChannelQualityDto>
      aria-label={label}
      rowKey="label"
      size="small"
      dataSource={channels}
      pagination={channels.length > 20 ? { pageSize: 20, showSizeChanger: false } : false}
      showSorterTooltip={false}
      // Too many columns for a phone: the table scrolls sideways instead of squeezing.
      scroll={{ x: 'max-content' }}
      locale={{ emptyText: 'No channel checks.' }}
      columns={[
        {
          key: 'label',
          title: 'Channel',
          sorter: (a, b) => a.label.localeCompare(b.label),
          render: (_, row) => (
            <span>
              {row.label}
              {row.flat && (
                <Tag color={GYRE_COLORS.amberText} style={{ marginLeft: 8 }}>
                  flat
                </Tag>
              )}
              {row.saturated && (
                <Tag color={GYRE_COLORS.amberText} style={{ marginLeft: 8 }}>
                  clipped
                </Tag>
              )}
            </span>
          ),
        },
        {
          key: 'sd',
          title: 'SD',
          align: 'right',
          sorter: byNumber((r) => r.standardDeviationUv),
          render: (_, row) =>
            row.standardDeviationUv === null
              ? '—'
              : `${formatNumber(row.standardDeviationUv, 1)}\u00a0µV`,
        },
        {
          key: 'line50',
          title: 'Line noise 50 Hz',
          align: 'right',
          sorter: byNumber((r) => r.lineNoiseRatio50Hz),
          render: (_, row) => ratio(row.lineNoiseRatio50Hz),
        },
        {
          key: 'line60',
          title: 'Line noise 60 Hz',
          align: 'right',
          sorter: byNumber((r) => r.lineNoiseRatio60Hz),
          render: (_, row) => ratio(row.lineNoiseRatio60Hz),
        },
        {
          key: 'slips',
          title: 'Phase slips',
          align: 'right',
          sorter: byNumber((r) => r.phaseSlipShare),
          render: (_, row) => formatShareAsPercent(row.phaseSlipShare),
        },
      ]}
    />
  );
}
