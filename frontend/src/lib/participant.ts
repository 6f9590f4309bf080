import type { ParticipantView } from '@gyre/shared';
import { useRead } from './use-read';

/** `GET /api/participants/:participantId`: one participant (code, site, group, status). */
export const participantKey = (participantId: string) =>
  `/api/participants/${encodeURIComponent(participantId)}`;

/** Asks nothing while the id is not known. */
export function useParticipant(participantId: string | undefined) {
  return useRead<ParticipantView>(
    participantId === undefined ? null : participantKey(participantId),
  );
}
