import type { FlagChange, FlagDto } from '@gyre/shared';
import { mutate } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitFlagKey } from './get-visit-flag';

/** `POST /api/visits/:visitId/flag`: raises the slowing flag with the analyst's reason. */
export async function raiseFlag(visitId: string, change: FlagChange): Promise<FlagDto> {
  const flag = await apiSend<FlagDto>(visitFlagKey(visitId), 'POST', change);
  await mutate(visitFlagKey(visitId));
  return flag;
}
