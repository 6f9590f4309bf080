import { subject, type CalibrationRunView, type SiteView } from '@gyre/shared';
import { Alert, Button, Card, Flex, Typography } from 'antd';
import { useState } from 'react';
import { PageHeader } from '../../../components/page-header';
import { EmptyState, ErrorState, LoadingState } from '../../../components/page-states';
import { useAppAbility } from '../../../lib/session/ability';
import {
  startCalibrationRun,
  useCalibrationSites,
  useLatestCalibrationRuns,
} from '../api/calibration-runs';
import { CalibrationResult, CalibrationStateTag } from './calibration-result';

function SiteCheckCard({
  site,
  run,
  onStarted,
}: {
  site: SiteView;
  run: CalibrationRunView | undefined;
  onStarted: () => Promise<unknown>;
}) {
  const ability = useAppAbility();
  const canRun = ability.can(
    'create',
    subject('Calibration', { studyId: site.studyId, siteId: site.id }),
  );
  const [starting, setStarting] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const busy = run?.state === 'queued' || run?.state === 'computing';
  const start = async () => {
    setStarting(true);
    setError(null);
    try {
      await startCalibrationRun(site.id);
      await onStarted();
    } catch (failure) {
      setError(failure instanceof Error ? failure.message : String(failure));
    } finally {
      setStarting(false);
    }
  };
  return (
    <Card
      title={`${site.code} · ${site.name}`}
      extra={
        <Flex gap={8} align="center">
          {run !== undefined && <CalibrationStateTag run={run} />}
          {canRun && (
            <Button type="primary" loading={starting} disabled={busy} onClick={() => void start()}>
              Run calibration
            </Button>
          )}
        </Flex>
      }
      className="gyre-below"
    >
      {error !== null && <Alert type="error" showIcon className="gyre-below-sm" title={error} />}
      {run === undefined ? (
        <Typography.Text type="secondary">
          No calibration run yet.{canRun && ' Run one to check this installation.'}
        </Typography.Text>
      ) : (
        <>
          {busy && (
            <Typography.Paragraph type="secondary">
              Gyre is computing its calibration recording; the outcome appears here by itself.
            </Typography.Paragraph>
          )}
          <CalibrationResult run={run} />
        </>
      )}
    </Card>
  );
}

/**
 * Site check: each site's newest calibration run (Gyre computing its own recording with known
 * answers and comparing). Admins and the site's technicians start one; analysts and monitors
 * read them.
 */
export function SiteCheckPage() {
  const sites = useCalibrationSites();
  const runs = useLatestCalibrationRuns(true);
  const header = (
    <PageHeader
      title="Site check"
      description="Gyre computes a generated recording whose answers are known, through the same queue, code and study settings as every recording, and compares."
    />
  );
  if (sites.error !== undefined || runs.error !== undefined) {
    return (
      <>
        {header}
        <ErrorState
          error={sites.error ?? runs.error}
          onRetry={() => void Promise.all([sites.mutate(), runs.mutate()])}
        />
      </>
    );
  }
  if (sites.data === undefined || runs.data === undefined) {
    return (
      <>
        {header}
        <LoadingState label="Loading the site checks" />
      </>
    );
  }
  const bySite = new Map(runs.data.map((run) => [run.siteId, run]));
  return (
    <>
      {header}
      {sites.data.items.length === 0 ? (
        <EmptyState description="No sites yet." />
      ) : (
        sites.data.items.map((site) => (
          <SiteCheckCard
            key={site.id}
            site={site}
            run={bySite.get(site.id)}
            onStarted={() => runs.mutate()}
          />
        ))
      )}
    </>
  );
}
