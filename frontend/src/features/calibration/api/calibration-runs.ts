import type { CalibrationRunView, Page, SiteView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, apiSend, withQuery } from '../../../lib/api-client';

/** `GET /api/calibration-runs/latest`: the newest run of each site the user may read. */
export const latestCalibrationRunsKey = '/api/calibration-runs/latest';

const isActive = (run: CalibrationRunView) => run.state === 'queued' || run.state === 'computing';

/** Asks again every 2 s while a run waits or computes, so its outcome appears by itself. */
export function useLatestCalibrationRuns(enabled: boolean) {
  return useSWR<CalibrationRunView[]>(
    enabled ? latestCalibrationRunsKey : null,
    () => apiFetch<CalibrationRunView[]>(latestCalibrationRunsKey),
    { refreshInterval: (runs) => (runs?.some(isActive) ? 2000 : 0) },
  );
}

/** `GET /api/sites`: the sites the user may read, by code. */
export const calibrationSitesKey = withQuery('/api/sites', { pageSize: 100, sort: 'code' });

export function useCalibrationSites() {
  return useSWR<Page<SiteView>>(calibrationSitesKey, () =>
    apiFetch<Page<SiteView>>(calibrationSitesKey),
  );
}

/** `POST /api/sites/:siteId/calibration-runs`: queues a run. */
export function startCalibrationRun(siteId: string): Promise<CalibrationRunView> {
  return apiSend<CalibrationRunView>(
    `/api/sites/${encodeURIComponent(siteId)}/calibration-runs`,
    'POST',
  );
}
