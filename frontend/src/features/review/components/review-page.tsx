import type {
  AnalysisSettingsChange,
  AnalysisSettingsDto,
  RecordingDto,
  RecordingKind,
  RecordingResultsDto,
} from '@gyre/shared';
import { Alert, Button, Card, Col, Descriptions, Flex, Row, Skeleton, Tabs, Tag } from 'antd';
import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { PageHeader } from '../../../components/page-header';
import { EmptyState, ErrorState, LoadingState } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { formatDate, formatHz } from '../../../lib/format';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useClearFlag } from '../api/clear-flag';
import { useCreateAnalysisSettings } from '../api/create-analysis-settings';
import { useAnalysisSettings } from '../api/get-analysis-settings';
import { useParticipant } from '../api/get-participant';
import { useRecordingResults } from '../api/get-recording-results';
import { useVisit } from '../api/get-visit';
import { useVisitFlag } from '../api/get-visit-flag';
import { useVisitRecordings } from '../api/get-visit-recordings';
import { useVisitReport } from '../api/get-visit-report';
import { useRaiseFlag } from '../api/raise-flag';
import { useRerunRecording } from '../api/rerun-recording';
import { useRerunVisit } from '../api/rerun-visit';
import { ChannelTable } from './channel-table';
import { FlagPanel } from './flag-panel';
import { PersonName } from './person-name';
import { OnsetCurveChart } from './onset-curve-chart';
import { QualityChecks } from './quality-checks';
import { RecordingStateNotice } from './recording-state-notice';
import { RestSpectrumChart } from './rest-spectrum-chart';
import { RunSummary } from './run-summary';
import { SettingsForm } from './settings-form';
import { TrialRaster } from './trial-raster';

/** The recording of a kind that Review shows: the newest that was not rejected, else the newest. */
export function recordingOfKind(
  recordings: RecordingDto[],
  kind: RecordingKind,
): RecordingDto | null {
  const ofKind = recordings
    .filter((r) => r.kind === kind)
    .sort((a, b) => b.createdAt.localeCompare(a.createdAt));
  return ofKind.find((r) => r.state !== 'rejected') ?? ofKind[0] ?? null;
}

function roiLabelOf(results: RecordingResultsDto | undefined): string {
  const found = results?.quality.roiChannelsFound ?? [];
  return found.length === 0 ? 'ROI' : `ROI: ${found.join(', ')}`;
}

function StaleNotice({
  results,
  current,
  recording,
  canRerun,
}: {
  results: RecordingResultsDto;
  current: AnalysisSettingsDto | undefined;
  recording: RecordingDto;
  canRerun: boolean;
}) {
  const rerun = useRerunRecording();
  if (current === undefined || results.run.settingsVersion >= current.version) return null;
  return (
    <Alert
      type="info"
      showIcon
      style={{ marginBottom: 12 }}
      title={`Computed with settings version ${results.run.settingsVersion}; the study's current version is ${current.version}.`}
      action={
        canRerun ? (
          <Button
            size="small"
            onClick={() => void rerun(recording, `Bring up to settings version ${current.version}`)}
          >
            Re-run with version {current.version}
          </Button>
        ) : undefined
      }
    />
  );
}

const IN_PROGRESS: ReadonlySet<RecordingDto['state']> = new Set([
  'received',
  'queued',
  'computing',
]);

/**
 * One kind of recording's results, or why there are none yet. While a re-run is on its way
 * the last results stay on screen under a notice, so the analyst never loses the picture.
 */
function ResultsOf({
  recording,
  kindName,
  children,
}: {
  recording: RecordingDto | null;
  kindName: string;
  children: (results: RecordingResultsDto) => React.ReactNode;
}) {
  const showable =
    recording !== null &&
    recording.latestRunId !== null &&
    (recording.state === 'ready' || IN_PROGRESS.has(recording.state));
  const results = useRecordingResults(
    showable ? recording.id : null,
    showable ? recording.latestRunId : null,
  );
  if (recording === null) {
    return <EmptyState description={`No ${kindName} recording for this visit yet.`} />;
  }
  if (!showable) {
    return recording.state === 'ready' ? (
      <EmptyState description="No computed results yet." />
    ) : (
      <RecordingStateNotice recording={recording} />
    );
  }
  if (results.error !== undefined) {
    return (
      <ErrorState
        title={`The ${kindName} results could not be loaded`}
        error={results.error}
        onRetry={() => void results.mutate()}
      />
    );
  }
  if (results.data === undefined) return <Skeleton active paragraph={{ rows: 6 }} />;
  return (
    <>
      {IN_PROGRESS.has(recording.state) && (
        <div style={{ marginBottom: 12 }}>
          <Alert
            type="info"
            showIcon
            title="Computing again with the current settings; these are the previous results."
          />
          <RecordingStateNotice recording={recording} />
        </div>
      )}
      {children(results.data)}
    </>
  );
}

/**
 * `reportPanel` draws the report card's body (the app passes the sign-off feature's panel);
 * `watch` changes whenever the visit's flag does, so the panel can reload.
 */
export function ReviewPage({
  reportPanel,
}: {
  reportPanel?: (visitId: string, watch: unknown) => React.ReactNode;
} = {}) {
  const { visitId = '' } = useParams();
  const { me } = useSession();
  const ability = useAppAbility();
  const visit = useVisit(visitId);
  const participant = useParticipant(visit.data?.participantId);
  const recordings = useVisitRecordings(visitId);
  const settings = useAnalysisSettings(visit.data?.studyId);
  const flag = useVisitFlag(visitId);
  const report = useVisitReport(visitId);
  const raiseFlag = useRaiseFlag(visitId);
  const clearFlag = useClearFlag(visitId);
  const createAnalysisSettings = useCreateAnalysisSettings();
  const rerunVisit = useRerunVisit();

  const task = recordings.data === undefined ? null : recordingOfKind(recordings.data, 'task');
  const rest = recordings.data === undefined ? null : recordingOfKind(recordings.data, 'resting');
  // The suggestion follows the latest task run: ask again whenever a new run lands.
  const taskRunId = task?.latestRunId ?? null;
  const reloadFlag = flag.mutate;
  useEffect(() => {
    if (taskRunId !== null) void reloadFlag();
  }, [taskRunId, reloadFlag]);

  const canChangeSettings =
    ability.can('create', 'AnalysisSettings') && ability.can('rerun', 'AnalysisRun');
  const canRerun = ability.can('rerun', 'AnalysisRun');
  const canFlag = ability.can('create', 'Flag') && ability.can('update', 'Flag');

  if (visit.error !== undefined) {
    return (
      <>
        <ResearchCaution />
        <ErrorState
          title="This visit could not be loaded"
          error={visit.error}
          onRetry={() => void visit.mutate()}
        />
      </>
    );
  }
  if (visit.data === undefined) {
    return (
      <>
        <ResearchCaution />
        <LoadingState label="Loading the visit" rows={10} />
      </>
    );
  }

  const code = participant.data?.code ?? '…';

  const saveSettings = async (change: AnalysisSettingsChange) => {
    const created = await createAnalysisSettings(visit.data?.studyId ?? '', change);
    await rerunVisit(visitId, `Settings version ${created.version}: ${change.reason}`);
  };

  return (
    <>
      <ResearchCaution />
      <PageHeader
        title={`Review · ${code} · ${visit.data.label}`}
        description={`Visit of ${formatDate(visit.data.visitDate)}`}
        extra={
          <>
            {report.data !== undefined && report.data !== null && (
              <Tag color={report.data.state === 'draft' ? 'default' : '#24525A'}>
                Report: {report.data.state}
              </Tag>
            )}
            <Link to={paths.participant(visit.data.participantId)}>
              <Button>Trajectory of {code}</Button>
            </Link>
          </>
        }
      />
      {recordings.error !== undefined ? (
        <ErrorState
          title="The recordings could not be loaded"
          error={recordings.error}
          onRetry={() => void recordings.mutate()}
        />
      ) : recordings.data === undefined ? (
        <LoadingState label="Loading the recordings" rows={12} />
      ) : (
        <Row gutter={[20, 20]}>
          <Col xs={24} xl={16}>
            <Flex vertical gap={20}>
              <Card title="Onset: task recording" aria-label="Task results">
                <ResultsOf recording={task} kindName="task">
                  {(results) => (
                    <>
                      {task !== null && (
                        <StaleNotice
                          results={results}
                          current={settings.data}
                          recording={task}
                          canRerun={canRerun}
                        />
                      )}
                      <RunSummary run={results.run} />
                      {results.task === null ? (
                        <EmptyState description="This run has no task curves." />
                      ) : (
                        <>
                          <OnsetCurveChart task={results.task} roiLabel={roiLabelOf(results)} />
                          <div style={{ marginTop: 24 }}>
                            <TrialRaster task={results.task} bandHz={results.run.bandHz} />
                          </div>
                          <Descriptions
                            size="small"
                            style={{ marginTop: 16 }}
                            className="gyre-figures"
                            items={[
                              {
                                key: 'total',
                                label: 'Epochs',
                                children: String(results.task.epochs.total),
                              },
                              {
                                key: 'kept',
                                label: 'Kept',
                                children: String(results.task.epochs.kept),
                              },
                              {
                                key: 'dropped',
                                label: 'Dropped',
                                children:
                                  Object.entries(results.task.epochs.dropped)
                                    .filter(([, n]) => n > 0)
                                    .map(([why, n]) => `${n} ${why}`)
                                    .join(', ') || 'none',
                              },
                            ]}
                          />
                        </>
                      )}
                    </>
                  )}
                </ResultsOf>
              </Card>
              <Card title="Individual alpha frequency: resting recording" aria-label="Rest results">
                <ResultsOf recording={rest} kindName="resting">
                  {(results) => (
                    <>
                      {rest !== null && (
                        <StaleNotice
                          results={results}
                          current={settings.data}
                          recording={rest}
                          canRerun={canRerun}
                        />
                      )}
                      <RunSummary run={results.run} />
                      {results.rest === null ? (
                        <EmptyState description="This run has no spectrum." />
                      ) : (
                        <RestSpectrumChart rest={results.rest} roiLabel={roiLabelOf(results)} />
                      )}
                    </>
                  )}
                </ResultsOf>
              </Card>
              <Card title="Per channel: task" aria-label="Per-channel results">
                <ResultsOf recording={task} kindName="task">
                  {(results) => <ChannelTable channels={results.channels} />}
                </ResultsOf>
              </Card>
              <Card title="Quality checks" aria-label="Quality checks">
                <Tabs
                  items={[
                    {
                      key: 'task',
                      label: 'Task',
                      children: (
                        <ResultsOf recording={task} kindName="task">
                          {(results) => <QualityChecks quality={results.quality} kind="task" />}
                        </ResultsOf>
                      ),
                    },
                    {
                      key: 'rest',
                      label: 'Rest',
                      children: (
                        <ResultsOf recording={rest} kindName="resting">
                          {(results) => <QualityChecks quality={results.quality} kind="resting" />}
                        </ResultsOf>
                      ),
                    },
                  ]}
                />
              </Card>
            </Flex>
          </Col>
          <Col xs={24} xl={8}>
            <Flex vertical gap={20}>
              <Card title="Slowing flag" aria-label="Slowing flag">
                {flag.error !== undefined ? (
                  <ErrorState
                    title="The flag could not be loaded"
                    error={flag.error}
                    onRetry={() => void flag.mutate()}
                  />
                ) : flag.data === undefined ? (
                  <Skeleton active />
                ) : (
                  <FlagPanel
                    flag={flag.data}
                    meId={me.user.id}
                    renderPerson={(userId) => (
                      <PersonName
                        userId={userId}
                        meId={me.user.id}
                        studyId={visit.data?.studyId ?? ''}
                      />
                    )}
                    canChange={canFlag}
                    onRaise={async (change) => {
                      await raiseFlag(change);
                    }}
                    onClear={async (change) => {
                      await clearFlag(change);
                    }}
                  />
                )}
              </Card>
              <Card title="Analysis settings" aria-label="Analysis settings">
                {settings.error !== undefined ? (
                  <ErrorState
                    title="The settings could not be loaded"
                    error={settings.error}
                    onRetry={() => void settings.mutate()}
                  />
                ) : settings.data === undefined ? (
                  <Skeleton active />
                ) : canChangeSettings ? (
                  <SettingsForm current={settings.data} onSave={saveSettings} />
                ) : (
                  <SettingsSummary settings={settings.data} />
                )}
              </Card>
              <Card title="Report" aria-label="Report">
                {report.error !== undefined ? (
                  <ErrorState
                    title="The report could not be loaded"
                    error={report.error}
                    onRetry={() => void report.mutate()}
                  />
                ) : report.data === undefined ? (
                  <Skeleton active paragraph={{ rows: 1 }} />
                ) : report.data === null ? (
                  'No report has been drafted for this visit yet.'
                ) : reportPanel !== undefined ? (
                  reportPanel(visitId, flag.data)
                ) : (
                  <span>
                    <Tag>{report.data.state}</Tag> The visit report is a {report.data.state};
                    sign-off comes with the report screen.
                  </span>
                )}
              </Card>
            </Flex>
          </Col>
        </Row>
      )}
    </>
  );
}

/** The current settings, read-only (for those who may not change them). */
function SettingsSummary({ settings }: { settings: AnalysisSettingsDto }) {
  const window = ([a, b]: [number, number]) => `${a.toFixed(2)} to ${b.toFixed(2)} s`;
  return (
    <Descriptions
      size="small"
      column={1}
      className="gyre-figures"
      items={[
        { key: 'version', label: 'Version', children: String(settings.version) },
        {
          key: 'band',
          label: 'Band',
          children:
            settings.bandHz === null
              ? "visit's IAF ± 2 Hz (8–13 Hz without one)"
              : `${formatHz(settings.bandHz[0])} to ${formatHz(settings.bandHz[1])}`,
        },
        {
          key: 'method',
          label: 'Method',
          children:
            settings.method === 'filter'
              ? 'zero-phase band-pass'
              : `Morlet, ${settings.morletCycles} cycles`,
        },
        { key: 'epoch', label: 'Epoch', children: window(settings.epochWindowS) },
        { key: 'baseline', label: 'Baseline', children: window(settings.baselineWindowS) },
        { key: 'post', label: 'Post', children: window(settings.postWindowS) },
        {
          key: 'reject',
          label: 'Reject above',
          children: `${settings.rejectionThresholdUv.toFixed(0)} µV`,
        },
        {
          key: 'flag',
          label: 'Suggest flag at',
          children: `Δf ≤ ${formatHz(settings.flagThresholdHz)}`,
        },
        { key: 'roi', label: 'ROI', children: settings.roi.join(', ') },
        { key: 'reason', label: 'Why this version', children: settings.reason },
      ]}
    />
  );
}
