import type { FlagChange, VisitFlagView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { visitFlagKey } from './get-visit-flag';

/** `POST /api/visits/:visitId/flag/raise`: raises the slowing flag with the analyst's reason. */
export function raiseFlag(visitId: string, change: FlagChange): Promise<VisitFlagView> {
  return apiSend<VisitFlagView>(`${visitFlagKey(visitId)}/raise`, 'POST', change);
}

export function useRaiseFlag(visitId: string) {
  return useWrite(
    (change: FlagChange) => raiseFlag(visitId, change),
    (mutate, flag) => mutate(visitFlagKey(visitId), flag, { revalidate: false }),
  );
}
