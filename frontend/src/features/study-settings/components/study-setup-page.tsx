import { Card, Col, Form, Row, Select } from 'antd';
import { useSearchParams } from 'react-router-dom';
import { useAppAbility } from '../../../lib/session/ability';
import { PageHeader } from '../../../components/page-header';
import { EmptyState, pendingState } from '../../../components/page-states';
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
  const [search, setSearch] = useSearchParams();
  const studies = useStudies(true);
  const chosen = search.get('study');
  const known = studies.data?.items.some((s) => s.id === chosen) === true ? chosen : null;
  const studyId = known ?? (studies.data?.items.length === 1 ? studies.data.items[0].id : null);
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
      <Card className="gyre-below-md">
        <Form layout="vertical" component="div">
          <Form.Item label="Study" htmlFor="setup-study" className="gyre-flush-bottom">
            <Select
              id="setup-study"
              placeholder="Choose a study"
              value={studyId ?? undefined}
              onChange={(id: string) => setSearch({ study: id }, { replace: true })}
              options={studies.data.items.map((s) => ({
                value: s.id,
                label: `${s.code} · ${s.name}`,
              }))}
              style={{ maxWidth: 480, width: '100%' }}
            />
          </Form.Item>
        </Form>
      </Card>
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
