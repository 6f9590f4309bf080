import type { AnalysisSettingsChange } from '@gyre/shared';
import { App, Card, Col, Row, Typography } from 'antd';
import { PageHeader } from '../../../components/page-header';
import { EmptyState, pendingState } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useCreateAnalysisSettings } from '../api/create-analysis-settings';
import { useAnalysisSettings } from '../../../lib/analysis-settings';
import { SettingsForm } from './settings-form';
import { SettingsSummary } from './settings-summary';
import { SettingsVersions } from './settings-versions';
import { GroupsSection } from './groups-section';
import { TrendSettingsSection } from './trend-settings-section';
import { VisitScheduleSection } from './visit-schedule-section';

/**
 * Study settings (analyst edits, monitor reads): the analysis settings in force, every
 * version with what it changed and why, and the form for a new version; below, the study's
 * visit schedule, groups and trend settings, which an admin sets up (Study set-up).
 */
export function StudySettingsPage() {
  const { me } = useSession();
  const ability = useAppAbility();
  const { message } = App.useApp();
  const studyId = me.study?.id ?? null;
  const settings = useAnalysisSettings(studyId);
  const createAnalysisSettings = useCreateAnalysisSettings();
  const canChange = ability.can('create', 'AnalysisSettings');

  const header = (
    <>
      <ResearchCaution />
      <PageHeader
        title="Study settings"
        description={
          me.study === null
            ? 'The analysis settings of a study, version by version.'
            : `The analysis settings of ${me.study.name} (${me.study.code}): each change is a new version with its reason.`
        }
      />
    </>
  );

  if (studyId === null) {
    return (
      <>
        {header}
        <EmptyState description="You do not belong to a study, so there are no study settings to show." />
      </>
    );
  }
  const pending = pendingState(settings, {
    errorTitle: 'The settings could not be loaded',
    loadingLabel: 'Loading the settings',
    rows: 10,
  });
  if (pending !== null || settings.data === undefined) {
    return (
      <>
        {header}
        {pending}
      </>
    );
  }

  const current = settings.data;
  const save = async (change: AnalysisSettingsChange) => {
    const created = await createAnalysisSettings(studyId, change);
    message.success(`Version ${created.version} saved. Runs keep the numbers they have.`);
  };

  return (
    <>
      {header}
      <Row gutter={[20, 20]}>
        <Col xs={24} xl={canChange ? 14 : 24}>
          <Card
            title={`Current settings: version ${current.version}`}
            aria-label="Current settings"
          >
            <SettingsSummary settings={current} />
          </Card>
          <Card title="Versions" aria-label="Versions" className="gyre-above-md">
            <SettingsVersions
              studyId={studyId}
              currentVersion={current.version}
              meId={me.user.id}
            />
          </Card>
        </Col>
        {canChange && (
          <Col xs={24} xl={10}>
            <Card title={`New version ${current.version + 1}`} aria-label="New version">
              <Typography.Paragraph type="secondary">
                These settings hold for every visit of the study. A visit that needs other channels,
                another band or another onset label gets its own choices in Review.
              </Typography.Paragraph>
              {/* A new current version starts the form again from its values. */}
              <SettingsForm key={current.version} current={current} onSave={save} />
            </Card>
          </Col>
        )}
      </Row>
      {!canChange && (
        <Typography.Paragraph type="secondary" className="gyre-above">
          Read-only: the study&apos;s analysts change these settings.
        </Typography.Paragraph>
      )}
      <Row gutter={[20, 20]} className="gyre-above-md">
        <Col xs={24} xl={14}>
          <VisitScheduleSection studyId={studyId} canManage={false} />
        </Col>
        <Col xs={24} xl={10}>
          <div className="gyre-stack-md">
            <GroupsSection studyId={studyId} canManage={false} />
            {me.study !== null && <TrendSettingsSection study={me.study} canManage={false} />}
          </div>
        </Col>
      </Row>
      <Typography.Paragraph type="secondary" className="gyre-above">
        The visit schedule, groups and trend settings are set up by an administrator.
      </Typography.Paragraph>
    </>
  );
}
