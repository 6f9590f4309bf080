import { Can } from '@casl/react';
import type { AuditEntryView } from '@gyre/shared';
import { Alert, App, Button, Card, Flex, Pagination, Spin, Typography, theme } from 'antd';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { useSWRConfig } from 'swr';
import { PageHeader } from '../../../components/page-header';
import { EmptyState, ErrorState, TableSkeleton } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { ApiError } from '../../../lib/api-client';
import { formatNumber } from '../../../lib/format';
import { useAppAbility, type AppAbility } from '../../../lib/session/ability';
import { useAuditEntries } from '../api/audit-entries';
import { AUDIT_FILTER_NAMES, filtersFromSearch, type AuditFilters } from '../api/audit-filters';
import { auditVerifyKey } from '../api/audit-verify';
import { exportAudit } from '../api/export-audit';
import type { LedgerScreen } from '../lib/entry-sentence';
import { timeZoneNote } from '../lib/ledger-time';
import { ChainStatus } from './chain-status';
import { LedgerEntry } from './ledger-entry';
import { LedgerFilters } from './ledger-filters';

const PAGE_SIZE = 25;

/** Which screens the viewer may open (the router's rule for each, app/router.tsx). */
function screenOpener(ability: AppAbility): (screen: LedgerScreen) => boolean {
  return (screen) => {
    switch (screen) {
      case 'review':
      case 'participant':
        return ability.can('read', 'Result');
      case 'studySettings':
        return ability.can('read', 'AnalysisSettings');
      case 'team':
        return ability.can('update', 'User');
      case 'studySetup':
        return ability.can('update', 'PlannedVisit');
      case 'siteCheck':
        return ability.can('read', 'Calibration');
    }
  };
}

/** Entries hidden between two visible ones (newest first): the jump in their numbers. */
export function hiddenBetween(newer: AuditEntryView, older: AuditEntryView | undefined): number {
  return older === undefined ? 0 : Math.max(0, newer.seq - older.seq - 1);
}

const entriesWord = (n: number) => `${formatNumber(n, 0)} ${n === 1 ? 'entry' : 'entries'}`;

/** The Ledger (monitor): the audit trail as sentences, filtered, each entry with its changes. */
export function LedgerPage() {
  const [search, setSearch] = useSearchParams();
  const filters = filtersFromSearch(search);
  const filtered = Object.keys(filters).length > 0;
  const [page, setPage] = useState(1);
  const { data, error, isLoading, mutate } = useAuditEntries(filters, page, PAGE_SIZE);
  const { mutate: mutateKey } = useSWRConfig();
  const { message } = App.useApp();
  const { token } = theme.useToken();
  const ability = useAppAbility();
  const canOpen = screenOpener(ability);
  const [exporting, setExporting] = useState(false);
  const items = data?.items ?? [];
  const hidden = items.reduce((sum, entry, i) => sum + hiddenBetween(entry, items[i + 1]), 0);

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
        <Typography.Paragraph type="secondary" className="gyre-below-xs">
          {timeZoneNote()}.
        </Typography.Paragraph>
        {hidden > 0 && (
          <Alert
            type="info"
            showIcon
            role="note"
            aria-label="Why entry numbers jump"
            className="gyre-below-sm"
            title={
              filtered
                ? 'Entry numbers jump where entries do not match the filters or are outside your access.'
                : 'Entry numbers jump where entries are outside your access.'
            }
            description="Entries of other studies or sites, and account administration, are hidden from your view. The integrity check above still verifies the whole chain, hidden entries included."
          />
        )}
        {error !== undefined ? (
          <ErrorState
            error={error}
            onRetry={() => void mutate()}
            title="The trail could not be loaded"
          />
        ) : items.length === 0 ? (
          isLoading ? (
            <TableSkeleton />
          ) : (
            <EmptyState
              description={
                filtered ? 'No entry matches these filters.' : 'The trail is empty so far.'
              }
            />
          )
        ) : (
          <Spin spinning={isLoading}>
            <ol aria-label="Ledger entries, newest first" className="gyre-bare-list">
              {items.map((entry, i) => {
                const gap = hiddenBetween(entry, items[i + 1]);
                return (
                  <li
                    key={entry.seq}
                    style={{ borderTop: `1px solid ${token.colorBorderSecondary}` }}
                  >
                    <LedgerEntry entry={entry} canOpen={canOpen} />
                    {gap > 0 && (
                      <Typography.Text
                        type="secondary"
                        className="gyre-ledger-gap"
                        style={{ display: 'block', padding: '4px 0 8px', fontSize: 13 }}
                      >
                        ⋯ {entriesWord(gap)}{' '}
                        {filtered ? 'not shown (filters or access)' : 'outside your access'}
                      </Typography.Text>
                    )}
                  </li>
                );
              })}
            </ol>
            <Flex justify="space-between" align="center" wrap gap={8} className="gyre-above-sm">
              <Typography.Text type="secondary">{entriesWord(data?.total ?? 0)}</Typography.Text>
              <Pagination
                current={page}
                pageSize={PAGE_SIZE}
                total={data?.total ?? 0}
                showSizeChanger={false}
                size="small"
                onChange={setPage}
              />
            </Flex>
          </Spin>
        )}
      </Card>
    </>
  );
}
