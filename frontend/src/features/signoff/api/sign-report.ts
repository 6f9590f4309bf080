import type { ReportRevisionView, SignReportRequest } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { signOffKey } from './get-sign-off';

/** `POST /api/visits/:visitId/report/sign`: password again, the meaning, the previewed draft. */
export function signReport(
  visitId: string,
  request: SignReportRequest,
): Promise<ReportRevisionView> {
  return apiSend<ReportRevisionView>(
    `/api/visits/${encodeURIComponent(visitId)}/report/sign`,
    'POST',
    request,
  );
}

/** Signs, then refreshes what shows the report's state (sign-off, the report, revision lists). */
export function useSignReport(visitId: string) {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (request: SignReportRequest) => {
      const revision = await signReport(visitId, request);
      await mutate(
        (key) =>
          typeof key === 'string' &&
          (key === signOffKey(visitId) ||
            key === `/api/visits/${encodeURIComponent(visitId)}/report` ||
            key.startsWith('/api/report-revisions') ||
            key.startsWith('/api/reports')),
      );
      return revision;
    },
    [mutate, visitId],
  );
}
