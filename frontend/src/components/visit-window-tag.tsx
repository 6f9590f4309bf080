import type { VisitScheduleStatus } from '@gyre/shared';
import { Tag } from 'antd';
import { GYRE_COLORS } from '../app/theme';
import { formatCount } from '../lib/format';

/** Words for a visit's place in the schedule; the text carries the meaning, colour only helps. */
export function visitWindowText(schedule: VisitScheduleStatus): string {
  const days = (n: number) => formatCount(Math.abs(n), 'day');
  switch (schedule.window) {
    case 'in':
      return 'In window';
    case 'early':
      return `Early by ${days(schedule.daysFromTarget ?? 0)}`;
    case 'late':
      return `Late by ${days(schedule.daysFromTarget ?? 0)}`;
    case 'unplanned':
      return 'Unscheduled';
    case 'unknown':
      return 'Window unknown (no enrolment date)';
  }
}

/**
 * A visit's schedule status as a tag: out-of-window visits in amber with "Early by …" /
 * "Late by …" (counted from the target day, outside the allowed window), the others quiet.
 */
export function VisitWindowTag({ schedule }: { schedule: VisitScheduleStatus }) {
  const out = schedule.window === 'early' || schedule.window === 'late';
  return (
    <Tag
      color={out ? GYRE_COLORS.amberText : undefined}
      variant={out ? 'filled' : undefined}
      aria-label={`Schedule: ${visitWindowText(schedule)}`}
    >
      {visitWindowText(schedule)}
    </Tag>
  );
}

/** "Day 86 (target 84)" or "Day 27" or "—": where the visit falls after enrolment. */
export function studyDayText(schedule: VisitScheduleStatus): string {
  if (schedule.studyDay === null) return '—';
  return schedule.targetDay === null
    ? `Day ${schedule.studyDay}`
    : `Day ${schedule.studyDay} (target ${schedule.targetDay})`;
}
