import type { VisitView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { isDueKey } from './due';
import { visitsKey } from './visits';

/**
 * A visit on a planned visit (`plannedVisitId`; it takes the planned visit's name), or an
 * unscheduled one (`unscheduled: true` with a `label`; a study without a schedule needs only the label).
 */
export interface CreateVisitBody {
  participantId: string;
  plannedVisitId?: string;
  unscheduled?: boolean;
  label?: string;
  /** `YYYY-MM-DD`. */
  visitDate: string;
}

/** `POST /api/visits`: registers a visit of a participant. */
export function createVisit(body: CreateVisitBody): Promise<VisitView> {
  return apiSend<VisitView>('/api/visits', 'POST', body);
}

export function useCreateVisit() {
  return useWrite(createVisit, async (mutate, created, body) => {
    await mutate(visitsKey(body.participantId));
    await mutate(isDueKey(created.studyId));
  });
}
