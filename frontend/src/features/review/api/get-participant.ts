import type { ParticipantView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/participants/:participantId`: the code shown in the Review heading. */
export const participantKey = (participantId: string) =>
  `/api/participants/${encodeURIComponent(participantId)}`;

export function getParticipant(participantId: string): Promise<ParticipantView> {
  return apiFetch<ParticipantView>(participantKey(participantId));
}

export function useParticipant(participantId: string | undefined) {
  return useSWR<ParticipantView>(
    participantId === undefined ? null : participantKey(participantId),
    () => getParticipant(participantId ?? ''),
  );
}
