import type { Page, ParticipantView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/participants`: the participants the user may see (their site, for a technician). */
export const participantsKey = withQuery('/api/participants', { pageSize: 200, sort: 'code' });

export function getParticipants(): Promise<Page<ParticipantView>> {
  return apiFetch<Page<ParticipantView>>(participantsKey);
}

export function useParticipants() {
  return useSWR<Page<ParticipantView>>(participantsKey, getParticipants);
}
