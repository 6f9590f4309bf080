import { Alert, Card, Segmented } from 'antd';
import { useState } from 'react';
import { PageHeader } from '../../../components/page-header';
import { BlindedClosedNotice, isBlindedRefusal } from '../../../components/blinded-review-notice';
import { EmptyState, LoadingState, pendingState } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { useStudyPicker } from '../../../components/study-picker';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useStudies } from '../../../lib/studies';
import { useStudyOverview } from '../api/get-study-overview';
import { CompletionMatrix } from './completion-matrix';
import { GroupMeansTable } from './group-means-table';
import { OverviewCharts } from './overview-charts';
import type { OverviewSplit } from './overview-spec';
import { SiteQualityTable } from './site-quality-table';
import { StudyExportLinks } from './study-export-links';

/** Admins pick a study (`?study=`); everyone else sees their own. */
function useChosenStudy(): {
  studyId: string | null;
  picker: React.ReactNode;
  loading: boolean;
} {
  const { me } = useSession();
  const own = me.study?.id ?? null;
  const studies = useStudies(own === null);
  const { studyId, picker } = useStudyPicker('overview-study', studies.data?.items ?? []);
  if (own !== null) return { studyId: own, picker: null, loading: false };
  return { studyId, picker, loading: studies.data === undefined && studies.error === undefined };
}

/**
 * The study overview (analysts, monitors, admins): courses of PAF, CoG and Δf over the planned
 * visits with group or site means and 95 % CIs, the completion matrix and site quality.
 */
export function StudyOverviewPage() {
  const { studyId, picker, loading } = useChosenStudy();
  const overview = useStudyOverview(studyId);
  const canExport = useAppAbility().can('export', 'Result');
  const [split, setSplit] = useState<OverviewSplit>('group');

  const header = (
    <>
      <ResearchCaution />
      <PageHeader
        title="Study overview"
        description="Each participant's course over the planned visits, group and site means with their 95 % confidence intervals, what is done per visit, and how the sites' recordings compare."
      />
      {picker}
    </>
  );
  if (loading) {
    return (
      <>
        {header}
        <LoadingState label="Loading the studies" />
      </>
    );
  }
  if (studyId === null) {
    return (
      <>
        {header}
        <EmptyState description="Choose a study to see its overview." />
      </>
    );
  }
  if (isBlindedRefusal(overview.error)) {
    return (
      <>
        {header}
        <BlindedClosedNotice
          what="The study overview, with its results exports,"
          reason="It ties every visit to its planned visit, group and participant, which blinded review keeps from analysts. Your worklist and Review stay open; an admin can switch blinded review off in Study set-up when the blinded period ends."
        />
      </>
    );
  }
  const pending = pendingState(overview, {
    errorTitle: 'The overview could not be loaded',
    loadingLabel: 'Loading the overview',
    rows: 12,
  });
  if (pending !== null || overview.data === undefined) {
    return (
      <>
        {header}
        {pending}
      </>
    );
  }
  const data = overview.data;
  return (
    <>
      {header}
      {canExport && (
        <Card title="Results exports" className="gyre-below-md">
          <StudyExportLinks studyId={studyId} />
        </Card>
      )}
      {data.notes.length > 0 && (
        <Alert
          type="info"
          showIcon
          className="gyre-below-md"
          title="About these numbers"
          description={
            <ul aria-label="About these numbers" className="gyre-compact-list">
              {data.notes.map((note) => (
                <li key={note}>{note}</li>
              ))}
            </ul>
          }
        />
      )}
      <Card
        title="Courses over the planned visits"
        className="gyre-below-md"
        extra={
          <Segmented<OverviewSplit>
            aria-label="Means by"
            value={split}
            onChange={setSplit}
            options={[
              { value: 'group', label: 'By group' },
              { value: 'site', label: 'By site' },
            ]}
          />
        }
      >
        {data.plannedVisits.length === 0 ? (
          <EmptyState description="The study has no planned visits yet, so there is no course to draw." />
        ) : (
          <>
            <OverviewCharts overview={data} split={split} />
            <div className="gyre-above-md">
              <GroupMeansTable overview={data} split={split} />
            </div>
          </>
        )}
      </Card>
      <Card title="Completion" className="gyre-below-md">
        <CompletionMatrix overview={data} />
      </Card>
      <Card title="Site quality">
        <SiteQualityTable sites={data.siteQuality} />
      </Card>
    </>
  );
}
