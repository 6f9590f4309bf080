import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import { PlannedVisit } from './planned-visit.entity';
import { StudyGroup } from './study-group.entity';

export function toPlannedVisitView(row: PlannedVisit): PlannedVisitView {
  return {
    id: row.id,
    studyId: row.studyId,
    name: row.name,
    targetDay: row.targetDay,
    windowBeforeDays: row.windowBeforeDays,
    windowAfterDays: row.windowAfterDays,
    position: row.position,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}

export function toStudyGroupView(row: StudyGroup): StudyGroupView {
  return {
    id: row.id,
    studyId: row.studyId,
    name: row.name,
    description: row.description,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}
