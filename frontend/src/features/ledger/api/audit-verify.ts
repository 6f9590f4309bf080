import type { AuditVerifyResult } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/audit/verify`: recomputes the hash chain over every entry. */
export const auditVerifyKey = '/api/audit/verify';

export function getAuditVerify(): Promise<AuditVerifyResult> {
  return apiFetch<AuditVerifyResult>(auditVerifyKey);
}

/** `onChecked` runs after every answer, also when it equals the one before (a repeated check). */
export function useAuditVerify(onChecked?: (result: AuditVerifyResult) => void) {
  return useSWR<AuditVerifyResult>(auditVerifyKey, getAuditVerify, { onSuccess: onChecked });
}
