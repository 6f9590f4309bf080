/**
 * A study's visit schedule and groups, and the one place where a visit's place in the schedule
 * is computed: study day, window status and what is due. Pure functions on calendar dates
 * (`YYYY-MM-DD`), used by the server (views, the due list) and the client (the new-visit form).
 */

/** A calendar date written `YYYY-MM-DD`. */
export const CALENDAR_DATE_PATTERN = /^\d{4}-\d{2}-\d{2}$/;

export interface PlannedVisitView {
  id: string;
  studyId: string;
  /** Unique within the study; a visit picked on it takes this name as its label. */
  name: string;
  /** Target day counted from enrolment (the enrolment date is day 0). */
  targetDay: number;
  /** How many days before the target day a visit still counts as in window. */
  windowBeforeDays: number;
  /** How many days after the target day a visit still counts as in window. */
  windowAfterDays: number;
  /** Order in the schedule (0 first); ties go by target day. */
  position: number;
  createdAt: string;
  updatedAt: string;
}

export interface StudyGroupView {
  id: string;
  studyId: string;
  /** Unique within the study, e.g. an arm of a trial. */
  name: string;
  description: string;
  createdAt: string;
  updatedAt: string;
}

/**
 * Where a visit falls against its planned visit:
 * `in` inside the window; `early` / `late` outside it; `unplanned` when the visit has no
 * planned visit; `unknown` when the participant has no enrolment date.
 */
export type VisitWindow = 'in' | 'early' | 'late' | 'unplanned' | 'unknown';
export const VISIT_WINDOWS = ['in', 'early', 'late', 'unplanned', 'unknown'] as const;

/** The schedule part of a visit's view. */
export interface VisitScheduleStatus {
  plannedVisitId: string | null;
  plannedVisitName: string | null;
  /** visitDate − enrolmentDate in days (enrolment = day 0); null without an enrolment date. */
  studyDay: number | null;
  targetDay: number | null;
  /** Signed distance from the target day (study day − target day); null when either is unknown. */
  daysFromTarget: number | null;
  window: VisitWindow;
}

/** The fields of a planned visit the computation needs. */
export type PlannedVisitWindow = Pick<
  PlannedVisitView,
  'id' | 'name' | 'targetDay' | 'windowBeforeDays' | 'windowAfterDays'
>;

const DAY_MS = 86_400_000;

/**
 * Days since 1970-01-01 of a calendar date, or null when `value` is not a real day
 * (`2026-02-30`, `2025-02-29`). UTC arithmetic: calendar days, no time zone or DST shift.
 */
export function calendarDayNumber(value: string): number | null {
  if (!CALENDAR_DATE_PATTERN.test(value)) return null;
  const [year, month, day] = value.split('-').map(Number);
  const ms = Date.UTC(year, month - 1, day);
  const back = new Date(ms);
  if (
    back.getUTCFullYear() !== year ||
    back.getUTCMonth() !== month - 1 ||
    back.getUTCDate() !== day
  ) {
    return null;
  }
  return ms / DAY_MS;
}

/** Whether `value` is a real calendar day written `YYYY-MM-DD`. */
export function isCalendarDate(value: string): boolean {
  return calendarDayNumber(value) !== null;
}

/** The date `days` after `date` (negative: before), `YYYY-MM-DD`. */
export function addCalendarDays(date: string, days: number): string {
  const start = requireDay(date);
  return new Date((start + days) * DAY_MS).toISOString().slice(0, 10);
}

/** `to − from` in calendar days. */
export function daysBetween(from: string, to: string): number {
  return requireDay(to) - requireDay(from);
}

/** The study day of a visit: visitDate − enrolmentDate (the enrolment date is day 0). */
export function studyDay(enrolmentDate: string, visitDate: string): number {
  return daysBetween(enrolmentDate, visitDate);
}

/** The first and last date of a planned visit's window for a participant enrolled on `enrolmentDate`. */
export function windowDates(
  planned: PlannedVisitWindow,
  enrolmentDate: string,
): { opens: string; target: string; closes: string } {
  return {
    opens: addCalendarDays(enrolmentDate, planned.targetDay - planned.windowBeforeDays),
    target: addCalendarDays(enrolmentDate, planned.targetDay),
    closes: addCalendarDays(enrolmentDate, planned.targetDay + planned.windowAfterDays),
  };
}

/** A visit's place in the schedule; see {@link VisitWindow} for the statuses. */
export function visitScheduleStatus(input: {
  visitDate: string;
  enrolmentDate: string | null;
  planned: PlannedVisitWindow | null;
}): VisitScheduleStatus {
  const { visitDate, enrolmentDate, planned } = input;
  const day = enrolmentDate === null ? null : studyDay(enrolmentDate, visitDate);
  const base = {
    plannedVisitId: planned?.id ?? null,
    plannedVisitName: planned?.name ?? null,
    studyDay: day,
    targetDay: planned?.targetDay ?? null,
  };
  if (planned === null) return { ...base, daysFromTarget: null, window: 'unplanned' };
  if (day === null) return { ...base, daysFromTarget: null, window: 'unknown' };
  const offset = day - planned.targetDay;
  const window: VisitWindow =
    offset < -planned.windowBeforeDays ? 'early' : offset > planned.windowAfterDays ? 'late' : 'in';
  return { ...base, daysFromTarget: offset, window };
}

/** Whether a window status means "outside the planned window" (what screens mark). */
export function isOutOfWindow(window: VisitWindow): boolean {
  return window === 'early' || window === 'late';
}

/** A planned visit a participant has not done yet and whose window has opened. */
export interface DueVisit {
  plannedVisitId: string;
  plannedVisitName: string;
  targetDay: number;
  /** First day of the window, target date and last day of the window (`YYYY-MM-DD`). */
  opens: string;
  target: string;
  closes: string;
  /** `open`: the window is open on `asOf`; `overdue`: it closed without a visit. */
  status: 'open' | 'overdue';
  /** Days since the window closed (overdue), else 0. */
  daysOverdue: number;
}

/**
 * What a participant enrolled on `enrolmentDate` has due on `asOf`: each planned visit that
 * has no visit yet, whose window has opened, and that no later planned visit (by target day)
 * has overtaken — a planned visit passed over by a later visit that took place counts as
 * missed, not due. Ordered by target day.
 */
export function dueVisits(input: {
  schedule: PlannedVisitWindow[];
  enrolmentDate: string;
  /** Planned visits that have a visit (any date). */
  done: ReadonlySet<string>;
  asOf: string;
}): DueVisit[] {
  const ordered = [...input.schedule].sort((a, b) => a.targetDay - b.targetDay);
  const latestDoneTarget = ordered
    .filter((p) => input.done.has(p.id))
    .reduce((max, p) => Math.max(max, p.targetDay), -Infinity);
  const today = requireDay(input.asOf);
  const due: DueVisit[] = [];
  for (const planned of ordered) {
    if (input.done.has(planned.id) || planned.targetDay <= latestDoneTarget) continue;
    const dates = windowDates(planned, input.enrolmentDate);
    if (requireDay(dates.opens) > today) continue;
    const overdue = today - requireDay(dates.closes);
    due.push({
      plannedVisitId: planned.id,
      plannedVisitName: planned.name,
      targetDay: planned.targetDay,
      ...dates,
      status: overdue > 0 ? 'overdue' : 'open',
      daysOverdue: Math.max(overdue, 0),
    });
  }
  return due;
}

/** One participant's entry in `GET /api/studies/:studyId/due`. */
export interface DueParticipantView {
  participantId: string;
  participantCode: string;
  siteId: string;
  groupId: string | null;
  enrolmentDate: string;
  due: DueVisit[];
}

export interface DueListView {
  studyId: string;
  /** The day the list was computed for (`YYYY-MM-DD`). */
  asOf: string;
  participants: DueParticipantView[];
  /** Participants in scope without an enrolment date: nothing can be due for them. */
  withoutEnrolmentDate: number;
}

function requireDay(value: string): number {
  const day = calendarDayNumber(value);
  if (day === null) throw new RangeError(`${JSON.stringify(value)} is not a calendar date`);
  return day;
}
