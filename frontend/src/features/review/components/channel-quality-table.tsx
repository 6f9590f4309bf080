import type { ChannelQualityView } from '@gyre/shared';
import { Table, Tag } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { numberColumn } from '../../../components/number-column';
import { formatNumber, formatShareAsPercent } from '../../../lib/format';

const ratio = (value: number | null) => formatNumber(value, 2);

/** Each channel's signal checks: amplitude spread, flat or clipped signal, line noise, phase slips. */
export function ChannelQualityTable({
  channels,
  label,
}: {
  channels: ChannelQualityView[];
  label: string;
}) {
  return (
    <Table<ChannelQualityView>
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
        numberColumn<ChannelQualityView>(
          'SD',
          'sd',
          (r) => r.standardDeviationUv,
          (row) =>
            row.standardDeviationUv === null
              ? '—'
              : `${formatNumber(row.standardDeviationUv, 1)}\u00a0µV`,
        ),
        numberColumn<ChannelQualityView>(
          'Line noise 50 Hz',
          'line50',
          (r) => r.lineNoiseRatio50Hz,
          (row) => ratio(row.lineNoiseRatio50Hz),
        ),
        numberColumn<ChannelQualityView>(
          'Line noise 60 Hz',
          'line60',
          (r) => r.lineNoiseRatio60Hz,
          (row) => ratio(row.lineNoiseRatio60Hz),
        ),
        numberColumn<ChannelQualityView>(
          'Phase slips',
          'slips',
          (r) => r.phaseSlipShare,
          (row) => formatShareAsPercent(row.phaseSlipShare),
        ),
      ]}
    />
  );
}
