import type { FlagChange, VisitFlagDto } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitFlagKey } from './get-visit-flag';

/** `POST /api/visits/:visitId/flag/clear`: clears the raised flag with the analyst's reason. */
export function clearFlag(visitId: string, change: FlagChange): Promise<VisitFlagDto> {
  return apiSend<VisitFlagDto>(`${visitFlagKey(visitId)}/clear`, 'POST', change);
}

export function useClearFlag(visitId: string) {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (change: FlagChange) => {
      const flag = await clearFlag(visitId, change);
      await mutate(visitFlagKey(visitId), flag, { revalidate: false });
      return flag;
    },
    [mutate, visitId],
  );
}
