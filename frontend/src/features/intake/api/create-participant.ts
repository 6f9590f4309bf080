import type { ParticipantView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { participantsKey } from './participants';

export interface CreateParticipantBody {
  code: string;
  siteId: string;
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
      return created;
    },
    [mutate],
  );
}
