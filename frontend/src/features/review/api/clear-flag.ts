import type { FlagChange, VisitFlagView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { visitFlagKey } from './get-visit-flag';

/** `POST /api/visits/:visitId/flag/clear`: clears the raised flag with the analyst's reason. */
export function clearFlag(visitId: string, change: FlagChange): Promise<VisitFlagView> {
  return apiSend<VisitFlagView>(`${visitFlagKey(visitId)}/clear`, 'POST', change);
}

export function useClearFlag(visitId: string) {
  return useWrite(
    (change: FlagChange) => clearFlag(visitId, change),
    (mutate, flag) => mutate(visitFlagKey(visitId), flag, { revalidate: false }),
  );
}
