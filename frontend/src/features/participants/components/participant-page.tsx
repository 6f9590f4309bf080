import type {
  TrajectoryView,
  TrajectoryVisitView,
  VisitScheduleStatus,
  VisitView,
} from '@gyre/shared';
import { Button, Card, Descriptions, Space, Table, Tag, Typography } from 'antd';
import type { TableColumnType } from 'antd';
import { Link, useParams } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { GYRE_COLORS } from '../../../app/theme';
import { PageHeader } from '../../../components/page-header';
import { BlindedClosedNotice, isBlindedRefusal } from '../../../components/blinded-review-notice';
import { EmptyState, ErrorState, LoadingState } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { studyDayText, VisitWindowTag } from '../../../components/visit-window-tag';
import { formatCount, formatDate, formatDeltaHz, formatHz } from '../../../lib/format';
import { useGroups } from '../../../lib/study-schedule';
import { useParticipant } from '../../../lib/participant';
import { useParticipantVisits } from '../api/get-participant-visits';
import { useTrajectory } from '../api/get-trajectory';
import { ParticipantDetails } from './participant-details';
import { TrajectoryCharts, trendText } from './trajectory-charts';

export interface VisitRow {
  visitId: string;
  label: string;
  date: string;
  /** Null for a visit the trajectory knows but the visit list did not return. */
  schedule: VisitScheduleStatus | null;
  numbers: TrajectoryVisitView | null;
}

/** Every visit, with the trajectory's numbers where the visit has results. */
export function visitRows(visits: VisitView[], trajectory: TrajectoryVisitView[]): VisitRow[] {
  const byId = new Map(trajectory.map((t) => [t.visitId, t]));
  const rows: VisitRow[] = visits.map((v) => ({
    visitId: v.id,
    label: v.label,
    date: v.visitDate,
    schedule: v.schedule,
    numbers: byId.get(v.id) ?? null,
  }));
  for (const t of trajectory) {
    if (!visits.some((v) => v.id === t.visitId)) {
      rows.push({ visitId: t.visitId, label: t.label, date: t.date, schedule: null, numbers: t });
    }
  }
  return rows.sort((a, b) => a.date.localeCompare(b.date));
}

/** A change from the first visit, signed like every number on screen: "+0.12 Hz", "−0.30 Hz". */
export function formatChange(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return formatDeltaHz(value);
}

function valueWithChange(
  value: number | null | undefined,
  change: number | null | undefined,
  isFirst: boolean,
) {
  if (value === null || value === undefined) return '—';
  return (
    <span>
      {formatHz(value)}
      <br />
      <Typography.Text type="secondary" className="gyre-caption">
        {isFirst ? 'first value' : formatChange(change)}
      </Typography.Text>
    </span>
  );
}

type Series = 'pafHz' | 'cogHz' | 'deltaFHz';

/** The table's three number columns: each series beside its change from the first visit. */
const CHANGE_COLUMNS: {
  key: string;
  title: string;
  series: Series;
  change: 'pafChangeHz' | 'cogChangeHz' | 'deltaFChangeHz';
}[] = [
  { key: 'paf', title: 'PAF (change)', series: 'pafHz', change: 'pafChangeHz' },
  { key: 'cog', title: 'CoG (change)', series: 'cogHz', change: 'cogChangeHz' },
  { key: 'deltaF', title: 'Onset Δf (change)', series: 'deltaFHz', change: 'deltaFChangeHz' },
];

/** The visit each series is measured from: the first, by date, that has a value. */
function firstWithValue(rows: VisitRow[], series: Series): string | null {
  return rows.find((r) => r.numbers !== null && r.numbers[series] !== null)?.visitId ?? null;
}

export function ParticipantPage() {
  const { participantId = '' } = useParams();
  const participant = useParticipant(participantId);
  const trajectory = useTrajectory(participantId);
  const visits = useParticipantVisits(participantId);
  const groups = useGroups(participant.data?.studyId ?? null);

  const failed = participant.error ?? trajectory.error ?? visits.error;
  if (isBlindedRefusal(participant.error)) {
    return (
      <>
        <ResearchCaution />
        <BlindedClosedNotice
          what="This participant's page"
          reason="It would tie visits you have not decided on to the participant. It opens once you have recorded your decision (a flag, or no flag, with a reason) on one of their visits in Review; until then your worklist lists their visits under codes."
        />
      </>
    );
  }
  if (failed !== undefined) {
    return (
      <>
        <ResearchCaution />
        <ErrorState
          title="This participant could not be loaded"
          error={failed}
          onRetry={() => {
            void participant.mutate();
            void trajectory.mutate();
            void visits.mutate();
          }}
        />
      </>
    );
  }
  if (
    participant.data === undefined ||
    trajectory.data === undefined ||
    visits.data === undefined
  ) {
    return (
      <>
        <ResearchCaution />
        <LoadingState label="Loading the trajectory" rows={12} />
      </>
    );
  }
  const rows = visitRows(visits.data, trajectory.data.visits);
  const withResults = trajectory.data.visits.filter(
    (v) => v.pafHz !== null || v.cogHz !== null || v.deltaFHz !== null,
  );
  const code = participant.data.code;
  const first: Record<Series, string | null> = {
    pafHz: firstWithValue(rows, 'pafHz'),
    cogHz: firstWithValue(rows, 'cogHz'),
    deltaFHz: firstWithValue(rows, 'deltaFHz'),
  };
  return (
    <>
      <ResearchCaution />
      <PageHeader
        title={`Participant ${code}`}
        description={`${formatCount(rows.length, 'visit')}; change is measured from the first visit with a value.`}
        extra={
          <Link to={paths.participants}>
            <Button>All participants</Button>
          </Link>
        }
      />
      <Card className="gyre-below-md">
        <ParticipantDetails participant={participant.data} groups={groups.data ?? []} />
      </Card>
      <Card title="Trajectory" className="gyre-below-md">
        {withResults.length === 0 ? (
          <EmptyState description="No visit has computed results yet, so there is no trajectory to draw." />
        ) : (
          <>
            <TrajectoryCharts trajectory={trajectory.data} />
            <Descriptions
              size="small"
              className="gyre-above gyre-figures"
              column={{ xs: 1, md: 3 }}
              items={(['paf', 'cog', 'deltaF'] as const).map((key) => {
                const data = trajectory.data as TrajectoryView;
                return {
                  key,
                  label: `${key === 'paf' ? 'PAF' : key === 'cog' ? 'CoG' : 'Δf'} trend (Theil–Sen)`,
                  children: trendText(data.trends[key], data.trendRule),
                };
              })}
            />
          </>
        )}
      </Card>
      <Card title="Visits">
        <Table<VisitRow>
          aria-label="Visits"
          rowKey="visitId"
          scroll={{ x: 'max-content' }}
          size="middle"
          pagination={false}
          dataSource={rows}
          locale={{ emptyText: 'No visit registered for this participant yet.' }}
          columns={[
            {
              key: 'label',
              title: 'Visit',
              sorter: (a, b) => a.label.localeCompare(b.label),
              render: (_, row) => (
                <Link to={paths.review(row.visitId)} aria-label={`Review ${row.label}`}>
                  {row.label}
                </Link>
              ),
            },
            {
              key: 'date',
              title: 'Date',
              defaultSortOrder: 'ascend',
              sorter: (a, b) => a.date.localeCompare(b.date),
              render: (_, row) => formatDate(row.date),
            },
            {
              key: 'schedule',
              title: 'Schedule',
              render: (_, row) =>
                row.schedule === null ? (
                  '—'
                ) : (
                  <Space orientation="vertical" size={2}>
                    <VisitWindowTag schedule={row.schedule} />
                    <Typography.Text type="secondary" className="gyre-caption">
                      {studyDayText(row.schedule)}
                    </Typography.Text>
                  </Space>
                ),
            },
            ...CHANGE_COLUMNS.map(({ key, title, series, change }): TableColumnType<VisitRow> => ({
              key,
              title,
              align: 'right',
              render: (_, row) =>
                valueWithChange(
                  row.numbers?.[series],
                  row.numbers?.[change],
                  first[series] === row.visitId,
                ),
            })),
            {
              key: 'flag',
              title: 'Slowing flag',
              render: (_, row) =>
                row.numbers?.flagged === true ? (
                  <Tag color={GYRE_COLORS.amberText}>flagged</Tag>
                ) : (
                  <Typography.Text type="secondary">none</Typography.Text>
                ),
            },
            {
              // A doubtful number says so beside it, not only on Review.
              key: 'doubts',
              title: 'In doubt',
              render: (_, row) =>
                (row.numbers?.doubts.length ?? 0) === 0 ? (
                  <Typography.Text type="secondary">nothing</Typography.Text>
                ) : (
                  <ul
                    aria-label={`Doubts about ${row.label}`}
                    style={{ margin: 0, paddingLeft: 16, color: GYRE_COLORS.amberText }}
                  >
                    {row.numbers?.doubts.map((doubt) => (
                      <li key={doubt}>{doubt}</li>
                    ))}
                  </ul>
                ),
            },
          ]}
        />
      </Card>
    </>
  );
}
