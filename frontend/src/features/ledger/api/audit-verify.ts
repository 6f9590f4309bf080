import type { AuditVerifyResult } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/audit/verify`: recomputes the hash chain over every entry. */
export const auditVerifyKey = '/api/audit/verify';

export function getAuditVerify(): Promise<AuditVerifyResult> {
  return apiFetch<AuditVerifyResult>(auditVerifyKey);
}

export function useAuditVerify() {
  return useSWR<AuditVerifyResult>(auditVerifyKey, getAuditVerify);
}
