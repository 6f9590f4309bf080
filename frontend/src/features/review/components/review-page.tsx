import {
  EPOCH_DROP_WORDS,
  type RecordingView,
  type RecordingKind,
  type RecordingResultsView,
} from '@gyre/shared';
import { App, Button, Card, Col, Descriptions, Flex, Row, Skeleton, Tabs, Tag } from 'antd';
import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { PageHeader } from '../../../components/page-header';
import { VisitWindowTag } from '../../../components/visit-window-tag';
import { EmptyState, ErrorState, LoadingState } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { formatDate } from '../../../lib/format';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useClearFlag } from '../api/clear-flag';
import { useAnalysisSettings } from '../api/get-analysis-settings';
import { useParticipant } from '../api/get-participant';
import { useVisit } from '../api/get-visit';
import { useVisitFlag } from '../api/get-visit-flag';
import { useVisitOverride } from '../api/get-visit-override';
import { useVisitRecordings } from '../api/get-visit-recordings';
import { useVisitReport } from '../api/get-visit-report';
import { useVisitBlinding, useRecordBlindedDecision } from '../api/get-visit-blinding';
import { useVisitReview } from '../api/get-visit-review';
import { useMarkVisitReviewed } from '../api/mark-visit-reviewed';
import { useRaiseFlag } from '../api/raise-flag';
import { useSaveVisitOverride } from '../api/save-visit-override';
import { channelOptionsOf } from './channel-names';
import { BlindedDecisionCard } from './blinded-decision-card';
import { BlindedReviewHeader } from './blinded-review-header';
import { ChannelTable } from './channel-table';
import { ConditionsTable } from './conditions-table';
import { CycleEstimate } from './cycle-estimate';
import { FlagPanel } from './flag-panel';
import { OnsetCurveChart } from './onset-curve-chart';
import { OverrideCard } from './override-card';
import { OverrideForm } from './override-form';
import { PersonName } from './person-name';
import { QualityChecks } from './quality-checks';
import { RecordingStateNotice } from './recording-state-notice';
import { RestSpectrumChart } from './rest-spectrum-chart';
import { ReviewMark } from './review-mark';
import { RunNotices } from './run-notices';
import { RunSummary } from './run-summary';
import { ScalpMaps } from './scalp-map';
import { IN_PROGRESS, useShownResults } from './shown-results';
import { TrialRaster } from './trial-raster';
import { VisitSources } from './visit-sources';

/** A visit's current recording of a kind: the one a newer upload has not replaced. */
const CURRENT: ReadonlySet<RecordingView['state']> = new Set([
  'queued',
  'computing',
  'ready',
  'failed',
]);

/**
 * The recording of a kind that Review shows: the newest current one, else the newest still
 * being checked, else the newest (a rejected file, to say why). Never a superseded one while
 * another exists.
 */
export function recordingOfKind(
  recordings: RecordingView[],
  kind: RecordingKind,
): RecordingView | null {
  const ofKind = recordings
    .filter((r) => r.kind === kind)
    .sort((a, b) => b.createdAt.localeCompare(a.createdAt));
  return (
    ofKind.find((r) => CURRENT.has(r.state)) ??
    ofKind.find((r) => r.state === 'received' || r.state === 'validating') ??
    ofKind.find((r) => r.state !== 'superseded') ??
    ofKind[0] ??
    null
  );
}

function roiLabelOf(results: RecordingResultsView): string {
  const usage = results.run.roiUsage;
  return usage.used.length === 0 ? 'ROI: no channel' : `ROI: ${usage.used.join(', ')}`;
}

/**
 * One kind of recording's results, or why there are none yet. While a re-run is on its way
 * the last results stay on screen under a notice, so the analyst never loses the picture.
 */
function ResultsOf({
  recording,
  kindName,
  children,
}: {
  recording: RecordingView | null;
  kindName: string;
  children: (results: RecordingResultsView, recording: RecordingView) => React.ReactNode;
}) {
  const { showable, results } = useShownResults(recording);
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
          <RecordingStateNotice recording={recording} previousShown />
        </div>
      )}
      {children(results.data, recording)}
    </>
  );
}

/** Card titles wrap at phone width instead of being cut with an ellipsis. */
const WRAPPING_TITLE = { title: { whiteSpace: 'normal', overflowWrap: 'anywhere' } } as const;

/**
 * `reportPanel` draws the report card's body (the app passes the sign-off feature's panel);
 * `watch` changes whenever the visit's flag does, so the panel can reload.
 */
export function ReviewPage({
  reportPanel,
  reportStatus,
}: {
  reportPanel?: (visitId: string, watch: unknown) => React.ReactNode;
  /** The header's report chip (the app passes the sign-off feature's, read from the same data as the panel). */
  reportStatus?: (visitId: string) => React.ReactNode;
} = {}) {
  const { visitId = '' } = useParams();
  const { me } = useSession();
  const ability = useAppAbility();
  const { message } = App.useApp();
  const canReadSettings = ability.can('read', 'AnalysisSettings');
  // Blinded review: a visit blinded for the analyst is never asked for (the server refuses it).
  const blinding = useVisitBlinding(visitId);
  const blinded = blinding.data?.blinded === true;
  const visit = useVisit(visitId, blinding.data?.blinded === false);
  const recordDecision = useRecordBlindedDecision(visitId);
  const participant = useParticipant(visit.data?.participantId);
  const recordings = useVisitRecordings(visitId);
  const settings = useAnalysisSettings(canReadSettings ? blinding.data?.studyId : undefined);
  const override = useVisitOverride(visitId, canReadSettings);
  const flag = useVisitFlag(visitId);
  const report = useVisitReport(visitId);
  const raiseFlag = useRaiseFlag(visitId);
  const clearFlag = useClearFlag(visitId);
  const saveOverride = useSaveVisitOverride(visitId);
  const review = useVisitReview(visitId, ability.can('read', 'VisitReview'));
  const markReviewed = useMarkVisitReviewed(visitId);
  const [overrideOpen, setOverrideOpen] = useState(false);

  const task = recordings.data === undefined ? null : recordingOfKind(recordings.data, 'task');
  const rest = recordings.data === undefined ? null : recordingOfKind(recordings.data, 'resting');
  const taskResults = useShownResults(task).results.data;
  // The suggestion follows the latest task run: ask again whenever a new run lands.
  const taskRunId = task?.latestRunId ?? null;
  const reloadFlag = flag.mutate;
  useEffect(() => {
    if (taskRunId !== null) void reloadFlag();
  }, [taskRunId, reloadFlag]);
  // Whether the visit counts as reviewed follows its current runs and recordings' states.
  const runsNow = [task, rest].map((r) => `${r?.id}:${r?.state}:${r?.latestRunId}`).join(' ');
  const reloadReview = review.mutate;
  useEffect(() => {
    void reloadReview();
  }, [runsNow, reloadReview]);

  const canRerun = ability.can('rerun', 'AnalysisRun');
  const canChangeOverride = ability.can('update', 'AnalysisSettings') && canRerun;
  const canFlag = ability.can('create', 'Flag') && ability.can('update', 'Flag');
  const openOverride =
    canChangeOverride && override.data !== undefined ? () => setOverrideOpen(true) : undefined;

  const loadError = blinding.error ?? visit.error;
  if (loadError !== undefined) {
    return (
      <>
        <ResearchCaution />
        <ErrorState
          title="This visit could not be loaded"
          notFoundTitle="This visit does not exist or you cannot open it"
          back={{ to: paths.home, label: 'Back to the start' }}
          error={loadError}
          onRetry={() => void Promise.all([blinding.mutate(), visit.mutate()])}
        />
      </>
    );
  }
  if (blinding.data === undefined || (!blinded && visit.data === undefined)) {
    return (
      <>
        <ResearchCaution />
        <LoadingState label="Loading the visit" rows={10} />
      </>
    );
  }

  const code = participant.data?.code ?? '…';
  // The channels the override may choose: those of the visit's files, by 10-10 name.
  const fileLabels = [...(task?.facts?.channelLabels ?? []), ...(rest?.facts?.channelLabels ?? [])];
  const channelOptions = channelOptionsOf(
    fileLabels.length > 0 ? fileLabels : (taskResults?.channels.map((c) => c.label) ?? []),
  );

  return (
    <>
      <ResearchCaution />
      {blinded || visit.data === undefined ? (
        <BlindedReviewHeader blinding={blinding.data} />
      ) : (
        <PageHeader
          title={`Review · ${code} · ${visit.data.label}`}
          description={
            <Flex component="span" wrap gap={8} align="center">
              <span>Visit of {formatDate(visit.data.visitDate)}</span>
              <VisitWindowTag schedule={visit.data.schedule} />
            </Flex>
          }
          extra={
            <Flex wrap gap={8} align="center">
              {report.data !== undefined && report.data !== null && reportStatus?.(visitId)}
              <Link to={paths.participant(visit.data.participantId)}>
                <Button>Trajectory of {code}</Button>
              </Link>
            </Flex>
          }
        />
      )}
      {recordings.error !== undefined ? (
        <ErrorState
          title="The recordings could not be loaded"
          error={recordings.error}
          onRetry={() => void recordings.mutate()}
        />
      ) : recordings.data === undefined ? (
        <LoadingState label="Loading the recordings" rows={12} />
      ) : (
        <>
          <VisitSources task={task} rest={rest} all={recordings.data} />
          <Row gutter={[{ xs: 0, xl: 20 }, 20]}>
            <Col xs={24} xl={16}>
              <Flex vertical gap={20}>
                <Card
                  styles={WRAPPING_TITLE}
                  title="Onset: task recording"
                  aria-label="Task results"
                >
                  <ResultsOf recording={task} kindName="task">
                    {(results, recording) => (
                      <>
                        <RunNotices
                          results={results}
                          recording={recording}
                          canRerun={canRerun}
                          onChooseChannels={openOverride}
                        />
                        <RunSummary run={results.run} />
                        {results.task === null ? (
                          // With no region channel left, the notice above already says why.
                          results.run.roiUsage.status !== 'none' && (
                            <EmptyState description="No onset curves were computed for this run; the quality checks below say what the file held." />
                          )
                        ) : (
                          <>
                            <CycleEstimate
                              run={results.run}
                              cycles={results.task.cycles}
                              studyThresholdHz={settings.data?.cycleDisagreementHz ?? null}
                            />
                            <OnsetCurveChart
                              recordingId={recording.id}
                              runId={results.run.id}
                              task={results.task}
                              roiLabel={roiLabelOf(results)}
                              roiAvailable={results.run.roiUsage.status !== 'none'}
                            />
                            <div style={{ marginTop: 24 }}>
                              <TrialRaster
                                recordingId={recording.id}
                                runId={results.run.id}
                                task={results.task}
                                bandHz={results.run.bandHz}
                              />
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
                                      .map(([why, n]) => `${n} ${EPOCH_DROP_WORDS[why] ?? why}`)
                                      .join(', ') || 'none',
                                },
                              ]}
                            />
                            <ConditionsTable task={results.task} />
                          </>
                        )}
                      </>
                    )}
                  </ResultsOf>
                </Card>
                <Card
                  styles={WRAPPING_TITLE}
                  title="Individual alpha frequency: resting recording"
                  aria-label="Rest results"
                >
                  <ResultsOf recording={rest} kindName="resting">
                    {(results, recording) => (
                      <>
                        <RunNotices
                          results={results}
                          recording={recording}
                          canRerun={canRerun}
                          onChooseChannels={openOverride}
                        />
                        <RunSummary run={results.run} />
                        {results.rest === null ? (
                          results.run.roiUsage.status !== 'none' && (
                            <EmptyState description="No spectrum was computed for this run; the quality checks below say what the file held." />
                          )
                        ) : (
                          <RestSpectrumChart rest={results.rest} roiLabel={roiLabelOf(results)} />
                        )}
                      </>
                    )}
                  </ResultsOf>
                </Card>
                <Card
                  styles={WRAPPING_TITLE}
                  title="Per channel: task"
                  aria-label="Per-channel results"
                >
                  <ResultsOf recording={task} kindName="task">
                    {(results) => (
                      <ChannelTable channels={results.channels} roiUsage={results.run.roiUsage} />
                    )}
                  </ResultsOf>
                </Card>
                <Card styles={WRAPPING_TITLE} title="Scalp maps" aria-label="Scalp maps">
                  <ScalpMaps rest={rest} task={task} />
                </Card>
                <Card styles={WRAPPING_TITLE} title="Quality checks" aria-label="Quality checks">
                  <Tabs
                    items={[
                      {
                        key: 'task',
                        label: 'Task',
                        children: (
                          <ResultsOf recording={task} kindName="task">
                            {(results, recording) => (
                              <QualityChecks
                                quality={results.quality}
                                kind="task"
                                roiUsage={results.run.roiUsage}
                                lineFrequencyHz={recording.lineFrequencyHz}
                              />
                            )}
                          </ResultsOf>
                        ),
                      },
                      {
                        key: 'rest',
                        label: 'Rest',
                        children: (
                          <ResultsOf recording={rest} kindName="resting">
                            {(results, recording) => (
                              <QualityChecks
                                quality={results.quality}
                                kind="resting"
                                roiUsage={results.run.roiUsage}
                                lineFrequencyHz={recording.lineFrequencyHz}
                              />
                            )}
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
                {blinded && (
                  <BlindedDecisionCard blinding={blinding.data} onDecide={recordDecision} />
                )}
                {ability.can('read', 'VisitReview') && (
                  <Card
                    styles={WRAPPING_TITLE}
                    title="Review of this visit"
                    aria-label="Review of this visit"
                  >
                    {review.error !== undefined ? (
                      <ErrorState
                        title="The review state could not be loaded"
                        error={review.error}
                        onRetry={() => void review.mutate()}
                      />
                    ) : review.data === undefined ? (
                      <Skeleton active paragraph={{ rows: 1 }} />
                    ) : (
                      <ReviewMark
                        state={review.data}
                        meId={me.user.id}
                        onMark={async (fingerprint) => {
                          try {
                            await markReviewed(fingerprint);
                            message.success('The visit is marked reviewed.');
                          } catch (error) {
                            // Results may have moved on: show the state as it is now.
                            await review.mutate();
                            throw error;
                          }
                        }}
                      />
                    )}
                  </Card>
                )}
                <Card styles={WRAPPING_TITLE} title="Slowing flag" aria-label="Slowing flag">
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
                          studyId={blinding.data?.studyId ?? ''}
                        />
                      )}
                      canChange={canFlag && !blinded}
                      onRaise={async (change) => {
                        await raiseFlag(change);
                      }}
                      onClear={async (change) => {
                        await clearFlag(change);
                      }}
                    />
                  )}
                </Card>
                {canReadSettings && (
                  <Card
                    styles={WRAPPING_TITLE}
                    title="This visit's analysis choices"
                    aria-label="Visit analysis choices"
                  >
                    {override.error !== undefined ? (
                      <ErrorState
                        title="The visit's choices could not be loaded"
                        error={override.error}
                        onRetry={() => void override.mutate()}
                      />
                    ) : override.data === undefined ? (
                      <Skeleton active paragraph={{ rows: 2 }} />
                    ) : (
                      <OverrideCard
                        override={override.data}
                        study={settings.data}
                        canChange={canChangeOverride}
                        onChange={() => setOverrideOpen(true)}
                      />
                    )}
                  </Card>
                )}
                <Card styles={WRAPPING_TITLE} title="Report" aria-label="Report">
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
                    blinded ? (
                      'Sign-off opens once you have recorded your decision: reports are signed unblinded.'
                    ) : (
                      reportPanel(visitId, flag.data)
                    )
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
        </>
      )}
      {canChangeOverride && override.data !== undefined && (
        <OverrideForm
          open={overrideOpen}
          override={override.data}
          study={settings.data}
          channelOptions={channelOptions}
          onSave={saveOverride}
          onClose={() => setOverrideOpen(false)}
          onSaved={(saved) => {
            setOverrideOpen(false);
            message.success(
              `This visit's choices are saved (revision ${saved.revision}); its recordings are being computed again.`,
            );
          }}
        />
      )}
    </>
  );
}
