import { visitScheduleStatus, type PlannedVisitWindow, type VisitView } from '@gyre/shared';
import { Visit } from './visit.entity';

/** What a visit's view needs besides the row: its participant's enrolment date and its planned visit. */
export interface VisitScheduleContext {
  enrolmentDate: string | null;
  planned: PlannedVisitWindow | null;
}

export function toVisitView(visit: Visit, context: VisitScheduleContext): VisitView {
  return {
    id: visit.id,
    participantId: visit.participantId,
    studyId: visit.studyId,
    siteId: visit.siteId,
    label: visit.label,
    visitDate: visit.visitDate,
    plannedVisitId: visit.plannedVisitId,
    schedule: visitScheduleStatus({
      visitDate: visit.visitDate,
      enrolmentDate: context.enrolmentDate,
      planned: context.planned,
    }),
    createdAt: visit.createdAt,
    updatedAt: visit.updatedAt,
  };
}
