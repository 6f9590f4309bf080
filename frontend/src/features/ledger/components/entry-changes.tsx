import type { AuditEntryView } from '@gyre/shared';
import { Collapse, Descriptions, Table, Typography } from 'antd';
import { NO_VALUE } from '../../../lib/format';
import { changedFields, type ChangedField } from '../lib/entry-diff';

const breakAnywhere = { wordBreak: 'break-all' } as const;
/** Words stay whole; only an unbroken run longer than the cell (an id) is broken. */
const wrapLong = { overflowWrap: 'anywhere' } as const;
const jsonStyle = {
  ...breakAnywhere,
  whiteSpace: 'pre-wrap',
  margin: 0,
  fontSize: 12,
  maxHeight: 320,
  overflow: 'auto',
} as const;

/**
 * The details of one Ledger entry: the fields it changed (labels, units, names), its reason and
 * address, and behind "Recorded data" the JSON and hashes exactly as kept, for auditors.
 */
export function EntryChanges({ entry }: { entry: AuditEntryView }) {
  const rows = changedFields(entry.before, entry.after, entry.context?.people);
  return (
    <div className="gyre-ledger-details">
      {rows.length === 0 ? (
        <Typography.Paragraph type="secondary">This entry changed no field.</Typography.Paragraph>
      ) : (
        <div className="gyre-scroll-region">
          <Table<ChangedField>
            size="small"
            rowKey="path"
            pagination={false}
            dataSource={rows}
            aria-label={`Changes in entry ${entry.seq}`}
            tableLayout="fixed"
            columns={[
              { title: 'Field', dataIndex: 'label', width: '30%' },
              {
                title: 'Before',
                dataIndex: 'before',
                render: (value: string) => <span style={wrapLong}>{value}</span>,
              },
              {
                title: 'After',
                dataIndex: 'after',
                render: (value: string) => (
                  <Typography.Text strong style={wrapLong}>
                    {value}
                  </Typography.Text>
                ),
              },
            ]}
          />
        </div>
      )}
      <Descriptions
        size="small"
        column={1}
        className="gyre-above-sm"
        items={[
          { key: 'reason', label: 'Reason', children: entry.reason ?? NO_VALUE },
          { key: 'ip', label: 'From address', children: entry.clientIp ?? NO_VALUE },
        ]}
      />
      <Collapse
        size="small"
        ghost
        className="gyre-above-xs"
        items={[
          {
            key: 'recorded',
            label: 'Recorded data',
            children: (
              <Descriptions
                size="small"
                column={1}
                layout="vertical"
                items={[
                  {
                    key: 'object',
                    label: `Object (${entry.objectType})`,
                    children: (
                      <Typography.Text code style={breakAnywhere}>
                        {entry.objectId ?? NO_VALUE}
                      </Typography.Text>
                    ),
                  },
                  {
                    key: 'action',
                    label: 'Action',
                    children: <Typography.Text code>{entry.action}</Typography.Text>,
                  },
                  {
                    key: 'actor',
                    label: 'Actor',
                    children: (
                      <Typography.Text code style={breakAnywhere}>
                        {entry.actorEmail ?? 'system'} {entry.actorId ?? ''}
                      </Typography.Text>
                    ),
                  },
                  {
                    key: 'before',
                    label: 'Before',
                    children: <pre style={jsonStyle}>{JSON.stringify(entry.before, null, 2)}</pre>,
                  },
                  {
                    key: 'after',
                    label: 'After',
                    children: <pre style={jsonStyle}>{JSON.stringify(entry.after, null, 2)}</pre>,
                  },
                  {
                    key: 'hash',
                    label: 'Hash',
                    children: (
                      <Typography.Text code className="gyre-break-all gyre-caption">
                        {entry.hash}
                      </Typography.Text>
                    ),
                  },
                  {
                    key: 'prev',
                    label: 'Links to',
                    children: (
                      <Typography.Text code className="gyre-break-all gyre-caption">
                        {entry.prevHash}
                      </Typography.Text>
                    ),
                  },
                ]}
              />
            ),
          },
        ]}
      />
    </div>
  );
}
