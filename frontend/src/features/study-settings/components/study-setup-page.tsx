import { Card, Col, Form, Row, Select } from 'antd';
import { useSearchParams } from 'react-router-dom';
import { useAppAbility } from '../../../lib/session/ability';
import { PageHeader } from '../../../components/page-header';
import { EmptyState, ErrorState, LoadingState } from '../../../components/page-states';
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
  if (studies.error !== undefined) {
    return (
      <>
        {header}
        <ErrorState
          title="The studies could not be loaded"
          error={studies.error}
          onRetry={() => void studies.mutate()}
        />
      </>
    );
  }
  if (studies.data === undefined) {
    return (
      <>
        {header}
        <LoadingState label="Loading the studies" />
      </>
    );
  }
  return (
    <>
      {header}
      <Card style={{ marginBottom: 20 }}>
        <Form layout="vertical" component="div">
          <Form.Item label="Study" htmlFor="setup-study" style={{ marginBottom: 0 }}>
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
            <Space20>
              <GroupsSection key={studyId} studyId={studyId} canManage={canManage} />
              {study.data !== undefined && (
                <TrendSettingsSection study={study.data} canManage={canManage} />
              )}
              {study.data !== undefined && (
                <BlindedReviewSection study={study.data} canManage={canManage} />
              )}
            </Space20>
          </Col>
        </Row>
      )}
    </>
  );
}

function Space20({ children }: { children: React.ReactNode }) {
  return <div style={{ display: 'grid', gap: 20 }}>{children}</div>;
}
