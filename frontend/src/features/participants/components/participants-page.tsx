import type { ParticipantView } from '@gyre/shared';
import { Card, Input, Table } from 'antd';
import type { TablePaginationConfig, TableProps } from 'antd';
import { useEffect, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { PageHeader } from '../../../components/page-header';
import { ErrorState, LoadingState } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { formatDate } from '../../../lib/format';
import { useSession } from '../../../lib/session/session-context';
import { useGroups } from '../api/get-groups';
import { useSites } from '../api/get-sites';
import {
  PARTICIPANT_SORTS,
  useParticipants,
  type ParticipantQuery,
  type ParticipantSort,
} from '../api/get-participants';

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
  const { me } = useSession();
  const groups = useGroups(me.study?.id ?? null);
  const groupName = (groupId: string | null) =>
    groupId === null ? '—' : (groups.data?.find((g) => g.id === groupId)?.name ?? '…');
  const siteCode = (siteId: string) => sites.data?.find((site) => site.id === siteId)?.code ?? '…';

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

  const onChange: TableProps<ParticipantView>['onChange'] = (
    pagination: TablePaginationConfig,
    filters,
    sorter,
  ) => {
    const site = filters.site?.[0];
    const single = Array.isArray(sorter) ? sorter[0] : sorter;
    const column = single?.columnKey as ParticipantSort | undefined;
    const ordered = single?.order !== undefined && single.order !== null;
    update({
      page: pagination.current ?? 1,
      pageSize: pagination.pageSize ?? query.pageSize,
      sort: ordered && column !== undefined ? column : 'code',
      order: ordered && single.order === 'descend' ? 'desc' : 'asc',
      siteId: typeof site === 'string' ? site : null,
      // A new filter starts again from the first page.
      ...((typeof site === 'string' ? site : null) === query.siteId ? {} : { page: 1 }),
    });
  };

  return (
    <>
      <ResearchCaution />
      <PageHeader
        title="Participants"
        description="Everyone enrolled in your study, by pseudonymous code. Open one to follow their alpha rhythm across visits."
      />
      <Card>
        <Input.Search
          aria-label="Search participant codes"
          placeholder="Search by code, e.g. AC-0042"
          allowClear
          value={searchText}
          onChange={(event) => setSearchText(event.target.value)}
          onSearch={(value) => update({ search: value.trim(), page: 1 })}
          style={{ maxWidth: 360, marginBottom: 16 }}
        />
        {participants.error !== undefined && participants.data === undefined ? (
          <ErrorState
            title="The participants could not be loaded"
            error={participants.error}
            onRetry={() => void participants.mutate()}
          />
        ) : participants.data === undefined ? (
          <LoadingState label="Loading participants" rows={8} />
        ) : (
          <Table<ParticipantView>
            aria-label="Participants"
            rowKey="id"
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
              showTotal: (total) => `${total} participant${total === 1 ? '' : 's'}`,
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
                filters: (sites.data ?? []).map((site) => ({
                  text: `${site.code} · ${site.name}`,
                  value: site.id,
                })),
                filterMultiple: false,
                filteredValue: query.siteId === null ? null : [query.siteId],
                render: (_, row) => siteCode(row.siteId),
              },
              {
                key: 'enrolmentDate',
                title: 'Enrolment',
                render: (_, row) => formatDate(row.enrolmentDate),
              },
              {
                key: 'group',
                title: 'Group',
                render: (_, row) => groupName(row.groupId),
              },
              {
                key: 'createdAt',
                title: 'Registered in Gyre',
                responsive: ['md'],
                sorter: true,
                sortOrder: sortOrder('createdAt'),
                render: (_, row) => formatDate(row.createdAt),
              },
              {
                key: 'updatedAt',
                title: 'Last change',
                responsive: ['md'],
                render: (_, row) => formatDate(row.updatedAt),
              },
            ]}
          />
        )}
      </Card>
    </>
  );
}
