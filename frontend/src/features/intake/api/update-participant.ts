import type { ParticipantView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { isDueKey } from './due';
import { participantsKey } from './participants';

export interface UpdateParticipantBody {
  /** `YYYY-MM-DD`; null clears it. */
  enrolmentDate?: string | null;
  groupId?: string | null;
  reason?: string;
}

/** `PATCH /api/participants/:id`: the enrolment date and group (the code stays). */
export function updateParticipant(
  id: string,
  body: UpdateParticipantBody,
): Promise<ParticipantView> {
  return apiSend<ParticipantView>(`/api/participants/${encodeURIComponent(id)}`, 'PATCH', body);
}

export function useUpdateParticipant() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (participant: ParticipantView, body: UpdateParticipantBody) => {
      const updated = await updateParticipant(participant.id, body);
      await mutate(participantsKey);
      await mutate(isDueKey(participant.studyId));
      return updated;
    },
    [mutate],
  );
}
