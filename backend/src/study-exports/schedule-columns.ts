import { visitScheduleStatus, type VisitWindow } from '@gyre/shared';
import type { Participant } from '../participants/participant.entity';
import type { PlannedVisit } from '../schedule/planned-visit.entity';
import type { Visit } from '../visits/visit.entity';

/** The schedule columns of a participant and of one visit in the exports. */
export interface ScheduleColumns {
  /** The participant's group (arm) name; null when none was set. */
  group: string | null;
  /** `YYYY-MM-DD`, day 0 of the schedule; null when not set. */
  enrolmentDate: string | null;
  /** The planned visit's name; null for an unscheduled visit. */
  plannedVisit: string | null;
  /** visitDate − enrolmentDate in days (enrolment = day 0). */
  studyDay: number | null;
  /** study day − the planned visit's target day. */
  daysFromTarget: number | null;
  window: VisitWindow;
}

/** What the study's schedule gives the exports: its planned visits and groups by id. */
export interface StudySchedule {
  plannedById: ReadonlyMap<string, PlannedVisit>;
  groupById: ReadonlyMap<string, { name: string }>;
}

/**
 * The one place the exports take schedule facts from (schedule/ owns the rows; the shared
 * `visitScheduleStatus` computes study day and window as the visit views do). Without a visit
 * only the participant's columns are filled.
 */
export function scheduleColumnsOf(
  schedule: StudySchedule,
  participant: Pick<Participant, 'enrolmentDate' | 'groupId'>,
  visit: Pick<Visit, 'visitDate' | 'plannedVisitId'> | null,
): ScheduleColumns {
  const group =
    participant.groupId === null
      ? null
      : (schedule.groupById.get(participant.groupId)?.name ?? null);
  const plannedId = visit === null ? null : visit.plannedVisitId;
  const planned = plannedId === null ? null : (schedule.plannedById.get(plannedId) ?? null);
  if (visit === null) {
    return {
      group,
      enrolmentDate: participant.enrolmentDate,
      plannedVisit: null,
      studyDay: null,
      daysFromTarget: null,
      window: 'unplanned',
    };
  }
  const status = visitScheduleStatus({
    visitDate: visit.visitDate,
    enrolmentDate: participant.enrolmentDate,
    planned,
  });
  return {
    group,
    enrolmentDate: participant.enrolmentDate,
    plannedVisit: planned?.name ?? null,
    studyDay: status.studyDay,
    daysFromTarget: status.daysFromTarget,
    window: status.window,
  };
}
