import { OVERVIEW_MEASURES, type OverviewStat, type StudyOverviewView } from '@gyre/shared';
import { Table } from 'antd';
import { ScrollRegion } from '../../../components/scroll-region';
import { splitEntries, statsOf, type OverviewSplit } from './overview-spec';
import { formatNumber } from '../../../lib/format';

interface Row {
  id: string;
  name: string;
  visit: string;
  stats: Partial<Record<OverviewStat['measure'], OverviewStat>>;
}

const hz = (v: number) => formatNumber(v, 2);

function statText(s: OverviewStat | undefined): string {
  if (s === undefined || s.mean === null) return '—';
  const ci = s.ciLow === null || s.ciHigh === null ? 'no CI' : `${hz(s.ciLow)} to ${hz(s.ciHigh)}`;
  const doubt = s.doubtful > 0 ? `, ${s.doubtful} doubtful` : '';
  return `${hz(s.mean)} Hz (${ci}; n = ${s.n}${doubt})`;
}

/** The charts' numbers in words: mean, 95 % CI and n per group (or site) and planned visit. */
export function GroupMeansTable({
  overview,
  split,
}: {
  overview: StudyOverviewView;
  split: OverviewSplit;
}) {
  const stats = statsOf(overview, split);
  const rows: Row[] = splitEntries(overview, split).flatMap((entry) =>
    overview.plannedVisits.map((pv) => ({
      id: `${entry.key ?? 'none'}:${pv.id}`,
      name: entry.name,
      visit: pv.name,
      stats: Object.fromEntries(
        OVERVIEW_MEASURES.map((m) => [
          m,
          stats.find((s) => s.measure === m && s.plannedVisitId === pv.id && s.key === entry.key),
        ]),
      ),
    })),
  );
  return (
    <ScrollRegion label={`Means by ${split}, table`}>
      <Table<Row>
        aria-label={`Means by ${split}`}
        rowKey="id"
        size="small"
        pagination={false}
        tableLayout="auto"
        className="gyre-table-natural-width"
        dataSource={rows}
        columns={[
          { key: 'name', title: split === 'group' ? 'Group' : 'Site', dataIndex: 'name' },
          { key: 'visit', title: 'Planned visit', dataIndex: 'visit' },
          ...OVERVIEW_MEASURES.map((m) => ({
            key: m,
            title: m === 'paf' ? 'PAF' : m === 'cog' ? 'CoG' : 'Δf',
            render: (_: unknown, row: Row) => (
              <span className="gyre-figures gyre-nowrap">{statText(row.stats[m])}</span>
            ),
          })),
        ]}
      />
    </ScrollRegion>
  );
}
