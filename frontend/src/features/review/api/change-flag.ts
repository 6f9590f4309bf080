import type { FlagChange, VisitFlagView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { visitFlagKey } from './get-visit-flag';

/**
 * `POST /api/visits/:visitId/flag/raise` raises the slowing flag, `…/flag/clear` clears it, each
 * with the analyst's reason; the flag it answers replaces the cached one.
 */
export function useChangeFlag(visitId: string, action: 'raise' | 'clear') {
  return useWrite(
    (change: FlagChange) =>
      apiSend<VisitFlagView>(`${visitFlagKey(visitId)}/${action}`, 'POST', change),
    (mutate, flag) => mutate(visitFlagKey(visitId), flag, { revalidate: false }),
  );
}
