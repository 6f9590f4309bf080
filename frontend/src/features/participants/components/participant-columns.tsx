import type { LatestValue, ParticipantListItem } from '@gyre/shared';
import { Tag, Typography } from 'antd';
import { NO_VALUE } from '../../../lib/format';
import { GYRE_COLORS } from '../../../app/theme';

/** What the list says of the latest visit's report, e.g. "Revision 1 sent". */
export function listReportWords(report: ParticipantListItem['latestVisit']): string {
  if (report === null) return 'No visit yet';
  if (report.report === null) return 'No report yet';
  const { state, latestRevision } = report.report;
  if (latestRevision === null) return 'Draft, not signed';
  if (state === 'draft') return `Draft after revision ${latestRevision}`;
  return `Revision ${latestRevision} ${state === 'sent' ? 'sent' : 'signed'}`;
}

/** A latest value with the visit it comes from, or the no-value mark. */
export function LatestCell({
  value,
  format,
}: {
  value: LatestValue | null;
  format: (hz: number) => string;
}) {
  if (value === null) return <span aria-label="no value">{NO_VALUE}</span>;
  return (
    <span className="gyre-figures gyre-nowrap">
      {format(value.hz)}{' '}
      <Typography.Text type="secondary" className="gyre-caption">
        ({value.visitLabel})
      </Typography.Text>
    </span>
  );
}

/** Open flags: amber when any is raised. */
export function FlagsCell({ count }: { count: number | null }) {
  if (count === null) return <span>{NO_VALUE}</span>;
  if (count === 0) return <span className="gyre-figures">0</span>;
  return (
    <Tag color={GYRE_COLORS.amberText} className="gyre-figures">
      {count} open
    </Tag>
  );
}

/** The latest visit's label and its report's state. */
export function ReportCell({ latest }: { latest: ParticipantListItem['latestVisit'] }) {
  const words = listReportWords(latest);
  if (latest === null) return <Typography.Text type="secondary">{words}</Typography.Text>;
  return (
    <span>
      <span className="gyre-figures">{latest.label}</span>: {words}
    </span>
  );
}
