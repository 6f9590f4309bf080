import type { ParticipantListItem } from '@gyre/shared';
import { Card, Flex, Input, Select, Table } from 'antd';
import type { TablePaginationConfig, TableProps } from 'antd';
import { useEffect, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { BlindedReviewNotice } from '../../../components/blinded-review-notice';
import { PageHeader } from '../../../components/page-header';
import { LoadingState, ReadError } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { formatCount, formatDate, formatDeltaHz, formatHz } from '../../../lib/format';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useStudy } from '../../../lib/studies';
import { useSites } from '../api/get-sites';
import {
  PARTICIPANT_SORTS,
  useParticipants,
  type ParticipantQuery,
  type ParticipantSort,
} from '../api/get-participants';
import { FlagsCell, LatestCell, ReportCell } from './participant-columns';

const PAGE_SIZES = [20, 50, 100];

/** The table's state lives in the address, so a link or the back button restores it. */
function queryFrom(params: URLSearchParams): ParticipantQuery {
  const sort = params.get('sort');
  const page = Number(params.get('page'));
  const pageSize = Number(params.get('pageSize'));
  return {
    page: Number.isInteger(page) && page >= 1 ? page : 1,
    pageSize: PAGE_SIZES.includes(pageSize) ? pageSize : PAGE_SIZES[0],
    sort: PARTICIPANT_SORTS.includes(sort as ParticipantSort) ? (sort as ParticipantSort) : 'code',
    order: params.get('order') === 'desc' ? 'desc' : 'asc',
    search: params.get('search') ?? '',
    siteId: params.get('site'),
  };
}

export function ParticipantsPage() {
  const [params, setParams] = useSearchParams();
  const query = queryFrom(params);
  const [searchText, setSearchText] = useState(query.search);
  const participants = useParticipants(query);
  const sites = useSites();
  const ability = useAppAbility();
  const { me } = useSession();
  const study = useStudy(me.user.role === 'analyst' ? (me.study?.id ?? null) : null);
  const blinded = study.data?.blindedReview === true;
  // The hint shows a real code of the study: the first one the unfiltered list gave.
  const [exampleCode, setExampleCode] = useState<string | null>(null);
  const firstCode = participants.data?.items[0]?.code;
  // Set during render (React's pattern for state derived from what arrived), kept afterwards.
  if (exampleCode === null && query.search === '' && firstCode !== undefined) {
    setExampleCode(firstCode);
  }

  const update = (change: Partial<ParticipantQuery>) => {
    const next = { ...query, ...change };
    setParams(
      {
        page: String(next.page),
        pageSize: String(next.pageSize),
        sort: next.sort,
        order: next.order,
        ...(next.search === '' ? {} : { search: next.search }),
        ...(next.siteId === null ? {} : { site: next.siteId }),
      },
      { replace: true },
    );
  };

  // Ask the server once typing pauses, not on every key.
  useEffect(() => {
    if (searchText.trim() === query.search) return;
    const timer = setTimeout(() => update({ search: searchText.trim(), page: 1 }), 300);
    return () => clearTimeout(timer);
  });

  const sortOrder = (column: ParticipantSort) =>
    query.sort === column ? (query.order === 'asc' ? 'ascend' : 'descend') : null;

  const onChange: TableProps<ParticipantListItem>['onChange'] = (
    pagination: TablePaginationConfig,
    _filters,
    sorter,
  ) => {
    const single = Array.isArray(sorter) ? sorter[0] : sorter;
    const column = single?.columnKey as ParticipantSort | undefined;
    const ordered = single?.order !== undefined && single.order !== null;
    update({
      page: pagination.current ?? 1,
      pageSize: pagination.pageSize ?? query.pageSize,
      sort: ordered && column !== undefined ? column : 'code',
      order: ordered && single.order === 'descend' ? 'desc' : 'asc',
    });
  };

  return (
    <>
      <ResearchCaution />
      <PageHeader
        title="Participants"
        description="Everyone enrolled in your study, by pseudonymous code. Open one to follow their alpha rhythm across visits."
      />
      {blinded && (
        <BlindedReviewNotice description="Only participants with a visit you have recorded your decision on are listed, with those visits alone. The others appear once you decide on one of their visits in Review." />
      )}
      <Card>
        <Flex wrap gap={12} className="gyre-below">
          <Input.Search
            aria-label="Search participant codes"
            placeholder={
              exampleCode === null ? 'Search by code' : `Search by code, e.g. ${exampleCode}`
            }
            allowClear
            value={searchText}
            onChange={(event) => setSearchText(event.target.value)}
            onSearch={(value) => update({ search: value.trim(), page: 1 })}
            style={{ flex: '1 1 220px', maxWidth: 360 }}
          />
          <Select
            aria-label="Site"
            value={query.siteId ?? ''}
            onChange={(value: string) => update({ siteId: value === '' ? null : value, page: 1 })}
            options={[
              { value: '', label: 'All sites' },
              ...(sites.data ?? []).map((site) => ({ value: site.id, label: site.name })),
            ]}
            style={{ flex: '1 1 180px', maxWidth: 280 }}
          />
        </Flex>
        {participants.error !== undefined && participants.data === undefined ? (
          <ReadError read={participants} title="The participants could not be loaded" />
        ) : participants.data === undefined ? (
          <LoadingState label="Loading participants" rows={8} />
        ) : (
          <Table<ParticipantListItem>
            aria-label="Participants"
            rowKey="id"
            // Wide rows scroll inside the card, never the page (390 px phones).
            scroll={{ x: 'max-content' }}
            loading={participants.isValidating}
            dataSource={participants.data.items}
            onChange={onChange}
            showSorterTooltip={false}
            locale={{
              emptyText:
                query.search !== ''
                  ? `No participant code contains “${query.search}”.`
                  : query.siteId !== null
                    ? 'No participants at this site yet.'
                    : 'No participants in this study yet.',
            }}
            pagination={{
              current: query.page,
              pageSize: query.pageSize,
              total: participants.data.total,
              showSizeChanger: true,
              pageSizeOptions: PAGE_SIZES,
              showTotal: (total) => formatCount(total, 'participant'),
            }}
            columns={[
              {
                key: 'code',
                title: 'Participant',
                sorter: true,
                sortOrder: sortOrder('code'),
                render: (_, row) => (
                  <Link to={paths.participant(row.id)} className="gyre-figures">
                    {row.code}
                  </Link>
                ),
              },
              {
                key: 'site',
                title: 'Site',
                render: (_, row) => row.siteName,
              },
              {
                key: 'group',
                title: 'Group',
                render: (_, row) => row.groupName ?? '—',
              },
              {
                key: 'visits',
                title: 'Visits',
                align: 'right',
                render: (_, row) => <span className="gyre-figures">{row.visitCount}</span>,
              },
              ...(ability.can('read', 'Result')
                ? [
                    {
                      key: 'paf',
                      title: 'Latest PAF',
                      render: (_: unknown, row: ParticipantListItem) => (
                        <LatestCell value={row.latestPaf} format={formatHz} />
                      ),
                    },
                    {
                      key: 'deltaF',
                      title: 'Latest Δf',
                      render: (_: unknown, row: ParticipantListItem) => (
                        <LatestCell value={row.latestDeltaF} format={formatDeltaHz} />
                      ),
                    },
                  ]
                : []),
              ...(ability.can('read', 'Flag')
                ? [
                    {
                      key: 'flags',
                      title: 'Open flags',
                      render: (_: unknown, row: ParticipantListItem) => (
                        <FlagsCell count={row.openFlags} />
                      ),
                    },
                  ]
                : []),
              ...(ability.can('read', 'Report')
                ? [
                    {
                      key: 'report',
                      title: 'Latest visit: report',
                      render: (_: unknown, row: ParticipantListItem) => (
                        <ReportCell latest={row.latestVisit} />
                      ),
                    },
                  ]
                : []),
              {
                key: 'enrolmentDate',
                title: 'Enrolment',
                responsive: ['md'],
                render: (_, row) => formatDate(row.enrolmentDate),
              },
              {
                key: 'createdAt',
                title: 'Registered in Gyre',
                responsive: ['lg'],
                sorter: true,
                sortOrder: sortOrder('createdAt'),
                render: (_, row) => formatDate(row.createdAt),
              },
            ]}
          />
        )}
      </Card>
    </>
  );
}
