import type { VisitView } from '@gyre/shared';
import { Visit } from './visit.entity';

export function toVisitView(visit: Visit): VisitView {
  return {
    id: visit.id,
    participantId: visit.participantId,
    studyId: visit.studyId,
    siteId: visit.siteId,
    label: visit.label,
    visitDate: visit.visitDate,
    createdAt: visit.createdAt,
    updatedAt: visit.updatedAt,
  };
}
