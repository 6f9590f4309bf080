import type { WorkerTokenState, WorkerTokenView } from '@gyre/shared';
import { App, Button, Card, Segmented, Tag, Tooltip, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { useState } from 'react';
import { formatDateTime } from '../../../lib/format';
import { useWorkerTokens } from '../api/worker-tokens';
import { CreateWorkerTokenForm } from './create-worker-token-form';
import { RevokeWorkerTokenForm } from './revoke-worker-token-form';
import { PagedTable } from '../../../components/paged-table';
import { usePagedList } from '../../../components/use-paged-list';

const PAGE_SIZE = 10;

type Shown = WorkerTokenState | 'all';

/** Team (admin): the tokens computing machines use to fetch queued work and post results. */
export function WorkerTokensSection() {
  const { message } = App.useApp();
  const list = usePagedList<Shown>(PAGE_SIZE, 'live');
  const shown = list.filter;
  const tokens = useWorkerTokens(shown === 'all' ? null : shown, list.page, PAGE_SIZE);
  const [creating, setCreating] = useState(false);
  const [revoking, setRevoking] = useState<WorkerTokenView | null>(null);

  const columns: TableColumnsType<WorkerTokenView> = [
    {
      title: 'Name',
      dataIndex: 'name',
      render: (name: string, token) => (
        <>
          <Typography.Text strong>{name}</Typography.Text>
          {token.local && (
            <Tooltip title="Written to the server's data folder for workers on the same machine; replaced at every start.">
              <Tag style={{ marginInlineStart: 8 }}>This server</Tag>
            </Tooltip>
          )}
        </>
      ),
    },
    {
      title: 'Created',
      key: 'created',
      width: 240,
      render: (_, token) => (
        <>
          <span className="gyre-figures">{formatDateTime(token.createdAt)}</span>
          <br />
          <Typography.Text type="secondary">
            {token.createdById === null
              ? 'by Gyre at start'
              : `by ${token.createdByName ?? 'a former account'}`}
          </Typography.Text>
        </>
      ),
    },
    {
      title: 'Last used',
      dataIndex: 'lastUsedAt',
      width: 190,
      render: (at: string | null) =>
        at === null ? (
          <Typography.Text type="secondary">Never</Typography.Text>
        ) : (
          <span className="gyre-figures">{formatDateTime(at)}</span>
        ),
    },
    {
      title: 'State',
      key: 'state',
      width: 240,
      render: (_, token) =>
        token.revokedAt === null ? (
          <Tag color="success">Live</Tag>
        ) : (
          <>
            <Tag>Revoked</Tag>
            <span className="gyre-figures">{formatDateTime(token.revokedAt)}</span>
            {token.revokedReason !== null && (
              <>
                <br />
                <Typography.Text type="secondary">{token.revokedReason}</Typography.Text>
              </>
            )}
          </>
        ),
    },
    {
      title: '',
      key: 'actions',
      width: 110,
      render: (_, token) =>
        token.revokedAt === null && (
          <Button size="small" danger onClick={() => setRevoking(token)}>
            Revoke
          </Button>
        ),
    },
  ];

  return (
    <Card
      title="Worker tokens"
      role="region"
      aria-label="Worker tokens"
      className="gyre-above-lg"
      extra={<Button onClick={() => setCreating(true)}>Create a worker token</Button>}
    >
      <Typography.Paragraph type="secondary">
        Computing machines fetch queued recordings and post their results with a worker token. A
        token can do nothing else, and its secret is shown only once, when it is created.
      </Typography.Paragraph>
      <Segmented<Shown>
        value={shown}
        onChange={list.setFilter}
        aria-label="Show tokens"
        className="gyre-below"
        options={[
          { label: 'Live', value: 'live' },
          { label: 'Revoked', value: 'revoked' },
          { label: 'All', value: 'all' },
        ]}
      />
      <PagedTable<WorkerTokenView>
        query={tokens}
        loadErrorTitle="The worker tokens could not be loaded"
        emptyText={shown === 'revoked' ? 'No revoked token.' : 'No token.'}
        columns={columns}
        {...list.paging}
      />
      <CreateWorkerTokenForm open={creating} onClose={() => setCreating(false)} />
      {revoking !== null && (
        <RevokeWorkerTokenForm
          token={revoking}
          onClose={() => setRevoking(null)}
          onRevoked={(token) => {
            setRevoking(null);
            message.success(`"${token.name}" is revoked; workers using it are refused.`);
          }}
        />
      )}
    </Card>
  );
}
