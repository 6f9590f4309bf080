import type { FlagChange, VisitFlagDto } from '@gyre/shared';
import { mutate } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitFlagKey } from './get-visit-flag';

/** `POST /api/visits/:visitId/flag/raise`: raises the slowing flag with the analyst's reason. */
export async function raiseFlag(visitId: string, change: FlagChange): Promise<VisitFlagDto> {
  const flag = await apiSend<VisitFlagDto>(`${visitFlagKey(visitId)}/raise`, 'POST', change);
  await mutate(visitFlagKey(visitId), flag, { revalidate: false });
  return flag;
}
