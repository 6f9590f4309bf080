import type { ParticipantView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
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
  const { mutate } = useSWRConfig();
  return useCallback(
    async (body: CreateParticipantBody) => {
      const created = await createParticipant(body);
      await mutate(participantsKey);
      await mutate(isDueKey(created.studyId));
      return created;
    },
    [mutate],
  );
}
