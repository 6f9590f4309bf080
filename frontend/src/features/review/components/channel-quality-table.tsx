import type { ChannelQualityView } from '@gyre/shared';
import { Table, Tag } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { numberColumn } from '../../../components/number-column';
import { formatNumber, formatShareAsPercent } from '../../../lib/format';
import { checkedLineFrequencies } from './quality-findings';

const ratio = (value: number | null) => formatNumber(value, 2);

/** Each channel's signal checks: amplitude spread, flat or clipped signal, line noise, phase slips. */
export function ChannelQualityTable({
  channels,
  label,
  lineFrequencyHz = null,
}: {
  channels: ChannelQualityView[];
  label: string;
  /** The declared power line frequency: only its column is shown. */
  lineFrequencyHz?: 50 | 60 | null;
}) {
  const lineColumns = checkedLineFrequencies(lineFrequencyHz).map((hz) =>
    numberColumn<ChannelQualityView>(
      `Line noise ${hz} Hz`,
      `line${hz}`,
      (r) => (hz === 50 ? r.lineNoiseRatio50Hz : r.lineNoiseRatio60Hz),
      (row) => ratio(hz === 50 ? row.lineNoiseRatio50Hz : row.lineNoiseRatio60Hz),
    ),
  );
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
                <Tag color={GYRE_COLORS.amberText} className="gyre-review-beside">
                  flat
                </Tag>
              )}
              {row.saturated && (
                <Tag color={GYRE_COLORS.amberText} className="gyre-review-beside">
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
        ...lineColumns,
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
