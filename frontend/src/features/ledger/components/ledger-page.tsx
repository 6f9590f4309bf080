import { Can } from '@casl/react';
import type { AuditEntryView } from '@gyre/shared';
import { App, Button, Card, Table, Tag, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { useSWRConfig } from 'swr';
import { PageHeader } from '../../../components/page-header';
import { EmptyState, ErrorState, TableSkeleton } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import type { AppAbility } from '../../../lib/session/ability';
import { useAuditEntries } from '../api/audit-entries';
import { AUDIT_FILTER_NAMES, filtersFromSearch, type AuditFilters } from '../api/audit-filters';
import { auditVerifyKey } from '../api/audit-verify';
import { exportAudit } from '../api/export-audit';
import { ChainStatus } from './chain-status';
import { EntryChanges } from './entry-changes';
import { LedgerFilters } from './ledger-filters';

const FLAG_ACTIONS = new Set(['raise', 'clear']);
const WARNING_ACTIONS = new Set(['sign-in-failed', 'account-locked', 'refresh-reuse', 'reject']);

const columns: TableColumnsType<AuditEntryView> = [
  { title: '#', dataIndex: 'seq', width: 70, align: 'right' },
  {
    title: 'When',
    dataIndex: 'at',
    width: 190,
    render: (at: string) => <span className="gyre-figures">{formatDateTime(at)}</span>,
  },
  {
    title: 'Person',
    dataIndex: 'actorEmail',
    width: 230,
    ellipsis: true,
    render: (email: string | null) =>
      email ?? <Typography.Text type="secondary">Gyre</Typography.Text>,
  },
  {
    title: 'Action',
    dataIndex: 'action',
    width: 150,
    render: (action: string) => (
      <Tag color={FLAG_ACTIONS.has(action) || WARNING_ACTIONS.has(action) ? '#C77C02' : undefined}>
        {action}
      </Tag>
    ),
  },
  {
    title: 'Object',
    key: 'object',
    width: 200,
    render: (_, entry) => (
      <>
        {entry.objectType}{' '}
        {entry.objectId !== null && (
          <Typography.Text type="secondary" code style={{ fontSize: 12 }}>
            {entry.objectId.slice(0, 8)}
          </Typography.Text>
        )}
      </>
    ),
  },
  {
    title: 'Reason',
    dataIndex: 'reason',
    ellipsis: true,
    render: (reason: string | null) =>
      reason ?? <Typography.Text type="secondary">—</Typography.Text>,
  },
];

const PAGE_SIZE = 25;

/** The Ledger (monitor): the audit trail, filtered, each entry with its before and after. */
export function LedgerPage() {
  const [search, setSearch] = useSearchParams();
  const filters = filtersFromSearch(search);
  const [page, setPage] = useState(1);
  const { data, error, isLoading, mutate } = useAuditEntries(filters, page, PAGE_SIZE);
  const { mutate: mutateKey } = useSWRConfig();
  const { message } = App.useApp();
  const [exporting, setExporting] = useState(false);

  const applyFilters = (next: AuditFilters) => {
    const params = new URLSearchParams();
    for (const name of AUDIT_FILTER_NAMES) {
      const value = next[name];
      if (value !== undefined && value !== '') params.set(name, value);
    }
    setPage(1);
    setSearch(params, { replace: true });
  };

  const runExport = async () => {
    setExporting(true);
    try {
      await exportAudit(filters);
      message.success('The CSV is downloaded. The export itself is now in the trail.');
      // The export wrote an entry: show it and check the chain with it.
      await Promise.all([mutate(), mutateKey(auditVerifyKey)]);
    } catch (caught) {
      message.error(caught instanceof ApiError ? caught.message : 'The export failed.');
    } finally {
      setExporting(false);
    }
  };

  return (
    <>
      <ResearchCaution />
      <PageHeader
        title="Ledger"
        description="Who changed what, when and why. Entries are never changed or removed."
        extra={
          <Can<AppAbility> I="export" a="AuditEntry">
            <Button type="primary" onClick={() => void runExport()} loading={exporting}>
              Export CSV
            </Button>
          </Can>
        }
      />
      <ChainStatus />
      <Card>
        <LedgerFilters filters={filters} onChange={applyFilters} />
        {error !== undefined ? (
          <ErrorState
            error={error}
            onRetry={() => void mutate()}
            title="The trail could not be loaded"
          />
        ) : (
          <Table<AuditEntryView>
            rowKey="seq"
            size="middle"
            columns={columns}
            dataSource={data?.items ?? []}
            loading={isLoading && data !== undefined}
            expandable={{
              expandedRowRender: (entry) => <EntryChanges entry={entry} />,
              expandRowByClick: false,
            }}
            pagination={{
              current: page,
              pageSize: PAGE_SIZE,
              total: data?.total ?? 0,
              showSizeChanger: false,
              showTotal: (total) =>
                `${total.toLocaleString('en-GB')} ${total === 1 ? 'entry' : 'entries'}`,
              onChange: setPage,
            }}
            locale={{
              emptyText: isLoading ? (
                <TableSkeleton />
              ) : (
                <EmptyState
                  description={
                    Object.keys(filters).length > 0
                      ? 'No entry matches these filters.'
                      : 'The trail is empty so far.'
                  }
                />
              ),
            }}
          />
        )}
      </Card>
    </>
  );
}
