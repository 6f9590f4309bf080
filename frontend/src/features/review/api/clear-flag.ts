import type { FlagChange, VisitFlagDto } from '@gyre/shared';
import { mutate } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitFlagKey } from './get-visit-flag';

/** `POST /api/visits/:visitId/flag/clear`: clears the raised flag with the analyst's reason. */
export async function clearFlag(visitId: string, change: FlagChange): Promise<VisitFlagDto> {
  const flag = await apiSend<VisitFlagDto>(`${visitFlagKey(visitId)}/clear`, 'POST', change);
  await mutate(visitFlagKey(visitId), flag, { revalidate: false });
  return flag;
}
