import { Col, Row } from 'antd';
import { useAppAbility } from '../../../lib/session/ability';
import { PageHeader } from '../../../components/page-header';
import { EmptyState, pendingState } from '../../../components/page-states';
import { useStudyPicker } from '../../../components/study-picker';
import { useStudies, useStudy } from '../../../lib/studies';
import { GroupsSection } from './groups-section';
import { TrendSettingsSection } from './trend-settings-section';
import { BlindedReviewSection } from './blinded-review-section';
import { VisitScheduleSection } from './visit-schedule-section';

/**
 * Study set-up (admin): pick a study, then its visit schedule, its groups and its trend
 * settings. The study's own people see the same on Study settings, read-only.
 */
export function StudySetupPage() {
  const studies = useStudies(true);
  const { studyId, picker } = useStudyPicker('setup-study', studies.data?.items ?? []);
  const study = useStudy(studyId);
  const canManage = useAppAbility().can('update', 'PlannedVisit');

  const header = (
    <PageHeader
      title="Study set-up"
      description="Each study's visit schedule, groups and trend settings."
    />
  );
  const pending = pendingState(studies, {
    errorTitle: 'The studies could not be loaded',
    loadingLabel: 'Loading the studies',
  });
  if (pending !== null || studies.data === undefined) {
    return (
      <>
        {header}
        {pending}
      </>
    );
  }
  return (
    <>
      {header}
      {picker}
      {studyId === null ? (
        <EmptyState description="Choose a study to set up its schedule and groups." />
      ) : (
        <Row gutter={[20, 20]}>
          <Col xs={24} xl={14}>
            <VisitScheduleSection key={studyId} studyId={studyId} canManage={canManage} />
          </Col>
          <Col xs={24} xl={10}>
            <div className="gyre-stack-md">
              <GroupsSection key={studyId} studyId={studyId} canManage={canManage} />
              {study.data !== undefined && (
                <TrendSettingsSection study={study.data} canManage={canManage} />
              )}
              {study.data !== undefined && (
                <BlindedReviewSection study={study.data} canManage={canManage} />
              )}
            </div>
          </Col>
        </Row>
      )}
    </>
  );
}
