import type { OutboxMessageView, OutboxState } from '@gyre/shared';
import { Card, Segmented, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { PageHeader } from '../../../components/page-header';
import { formatDateTime } from '../../../lib/format';
import { useOutbox } from '../api/outbox';
import { GYRE_COLORS } from '../../../app/theme';
import { PagedTable } from '../../../components/paged-table';
import { usePagedList } from '../../../components/use-paged-list';
import {
  dateTimeColumn,
  stateFilterOptions,
  stateTagColumn,
  type StateLook,
} from '../../../components/table-columns';

const STATE_LOOK: Record<OutboxState, StateLook> = {
  // Status colours of the theme: each reads at ≥ 4.5:1 on its tint (app/theme.test.ts).
  queued: { label: 'Queued', color: 'processing' },
  sent: { label: 'Sent', color: 'success' },
  failed: { label: 'Failed', color: 'error' },
};

const columns: TableColumnsType<OutboxMessageView> = [
  dateTimeColumn('Created', 'createdAt', 190),
  { title: 'To', dataIndex: 'to' },
  { title: 'Subject', dataIndex: 'subject' },
  stateTagColumn(STATE_LOOK, 110),
  {
    title: 'Attempts',
    dataIndex: 'attempts',
    width: 90,
    align: 'right',
    render: (attempts: number) => <span className="gyre-figures">{attempts}</span>,
  },
  {
    title: 'Delivery',
    key: 'delivery',
    width: 260,
    render: (_, message) =>
      message.state === 'sent' ? (
        <span className="gyre-figures">{formatDateTime(message.sentAt)}</span>
      ) : message.lastError !== null ? (
        <Typography.Text style={{ color: GYRE_COLORS.amberText }}>
          {message.lastError}
          {message.nextAttemptAt !== null && ` Next try ${formatDateTime(message.nextAttemptAt)}.`}
        </Typography.Text>
      ) : (
        <Typography.Text type="secondary">Waiting to be sent</Typography.Text>
      ),
  },
];

const PAGE_SIZE = 25;

/** The outbox (admin): what Gyre has e-mailed or is about to, and whether it arrived. */
export function OutboxPage() {
  const list = usePagedList<OutboxState | 'all'>(PAGE_SIZE, 'all');
  const messages = useOutbox(list.filter === 'all' ? null : list.filter, list.page, PAGE_SIZE);
  return (
    <>
      <PageHeader
        title="Outbox"
        description="Invitations, reset links and report notices, with their delivery. Bodies are never shown."
        extra={
          <Segmented<OutboxState | 'all'>
            value={list.filter}
            onChange={list.setFilter}
            aria-label="Show messages in this state"
            options={stateFilterOptions(STATE_LOOK)}
          />
        }
      />
      <Card>
        <PagedTable<OutboxMessageView>
          query={messages}
          loadErrorTitle="The outbox could not be loaded"
          emptyText="No e-mail yet."
          columns={columns}
          {...list.paging}
          scrollLabel="Messages"
        />
      </Card>
    </>
  );
}
