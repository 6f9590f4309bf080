import type { FlagChange, VisitFlagDto } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitFlagKey } from './get-visit-flag';

/** `POST /api/visits/:visitId/flag/raise`: raises the slowing flag with the analyst's reason. */
export function raiseFlag(visitId: string, change: FlagChange): Promise<VisitFlagDto> {
  return apiSend<VisitFlagDto>(`${visitFlagKey(visitId)}/raise`, 'POST', change);
}

export function useRaiseFlag(visitId: string) {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (change: FlagChange) => {
      const flag = await raiseFlag(visitId, change);
      await mutate(visitFlagKey(visitId), flag, { revalidate: false });
      return flag;
    },
    [mutate, visitId],
  );
}
