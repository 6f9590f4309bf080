import type { ParticipantView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { isDueKey } from './due';
import { participantsKey } from './participants';

export interface CreateParticipantBody {
  code: string;
  siteId: string;
  /** `YYYY-MM-DD`: day 0 of the visit schedule. */
  enrolmentDate?: string;
  groupId?: string;
}

/** `POST /api/participants`: registers a pseudonymous participant code at a site. */
export function createParticipant(body: CreateParticipantBody): Promise<ParticipantView> {
  return apiSend<ParticipantView>('/api/participants', 'POST', body);
}

export function useCreateParticipant() {
  return useWrite(createParticipant, async (mutate, created) => {
    await mutate(participantsKey);
    await mutate(isDueKey(created.studyId));
  });
}
