import type { ParticipantView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';

/** `GET /api/participants?q=`: the participants the Ledger can be filtered by, by code. */
export const ledgerParticipantsKey = (search: string) =>
  withQuery('/api/participants', { q: search.trim(), pageSize: 20, sort: 'code', order: 'asc' });

/** Null key (no request) when the viewer may not read participants. */
export function useLedgerParticipants(search: string, enabled: boolean) {
  return usePage<ParticipantView>(enabled ? ledgerParticipantsKey(search) : null);
}

/** `GET /api/participants/:id`: the chosen participant's code, when it is not in the list. */
export function useLedgerParticipant(participantId: string | undefined, enabled: boolean) {
  return useSWR<ParticipantView>(
    enabled && participantId !== undefined ? `/api/participants/${participantId}` : null,
    (key: string) => apiFetch<ParticipantView>(key),
  );
}
