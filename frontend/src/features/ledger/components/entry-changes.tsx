import type { AuditEntryView } from '@gyre/shared';
import { Descriptions, Table, Typography } from 'antd';

interface ChangeRow {
  field: string;
  before: unknown;
  after: unknown;
  changed: boolean;
}

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

function show(value: unknown): string {
  if (value === undefined) return '(none)';
  if (value === null) return '(empty)';
  if (typeof value === 'string') return value;
  return JSON.stringify(value);
}

/** Field by field, what an entry's object was before and after the change. */
export function changeRows(before: unknown, after: unknown): ChangeRow[] {
  if (!isRecord(before) && !isRecord(after)) {
    if (before === null && after === null) return [];
    return [
      {
        field: '(value)',
        before,
        after,
        changed: JSON.stringify(before) !== JSON.stringify(after),
      },
    ];
  }
  const old = isRecord(before) ? before : {};
  const next = isRecord(after) ? after : {};
  const fields = [...new Set([...Object.keys(old), ...Object.keys(next)])];
  return fields.map((field) => ({
    field,
    before: old[field],
    after: next[field],
    changed: JSON.stringify(old[field]) !== JSON.stringify(next[field]),
  }));
}

/** The expanded view of one Ledger entry: before/after, reason, and its place in the chain. */
export function EntryChanges({ entry }: { entry: AuditEntryView }) {
  const rows = changeRows(entry.before, entry.after);
  return (
    <div style={{ padding: '4px 8px 8px' }}>
      {rows.length === 0 ? (
        <Typography.Paragraph type="secondary">
          This entry records no field values.
        </Typography.Paragraph>
      ) : (
        <Table<ChangeRow>
          size="small"
          rowKey="field"
          pagination={false}
          dataSource={rows}
          aria-label={`Before and after of entry ${entry.seq}`}
          columns={[
            { title: 'Field', dataIndex: 'field', width: 200 },
            {
              title: 'Before',
              dataIndex: 'before',
              render: (value: unknown) => <Typography.Text code>{show(value)}</Typography.Text>,
            },
            {
              title: 'After',
              dataIndex: 'after',
              render: (value: unknown, row) => (
                <Typography.Text
                  code
                  strong={row.changed}
                  style={row.changed ? { color: '#24525A' } : undefined}
                >
                  {show(value)}
                </Typography.Text>
              ),
            },
          ]}
          rowClassName={(row) => (row.changed ? 'gyre-changed' : '')}
        />
      )}
      <Descriptions
        size="small"
        column={2}
        style={{ marginTop: 12 }}
        items={[
          { key: 'reason', label: 'Reason', children: entry.reason ?? '—', span: 2 },
          {
            key: 'object',
            label: 'Object id',
            children: <Typography.Text code>{entry.objectId ?? '—'}</Typography.Text>,
          },
          { key: 'ip', label: 'From address', children: entry.clientIp ?? '—' },
          {
            key: 'hash',
            label: 'Hash',
            span: 2,
            children: (
              <Typography.Text code style={{ fontSize: 12 }}>
                {entry.hash}
              </Typography.Text>
            ),
          },
          {
            key: 'prev',
            label: 'Links to',
            span: 2,
            children: (
              <Typography.Text code style={{ fontSize: 12 }}>
                {entry.prevHash}
              </Typography.Text>
            ),
          },
        ]}
      />
    </div>
  );
}
