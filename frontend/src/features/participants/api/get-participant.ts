import type { ParticipantView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/participants/:participantId`. */
export const participantKey = (participantId: string) =>
  `/api/participants/${encodeURIComponent(participantId)}`;

export function getParticipant(participantId: string): Promise<ParticipantView> {
  return apiFetch<ParticipantView>(participantKey(participantId));
}

export function useParticipant(participantId: string) {
  return useSWR<ParticipantView>(participantKey(participantId), () =>
    getParticipant(participantId),
  );
}
