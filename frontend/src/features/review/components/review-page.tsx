import {
  EPOCH_DROP_WORDS,
  type RecordingView,
  type RecordingKind,
  type RecordingResultsView,
} from '@gyre/shared';
import { App, Button, Col, Descriptions, Flex, Row, Tabs, Tag } from 'antd';
import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { PageHeader } from '../../../components/page-header';
import { VisitWindowTag } from '../../../components/visit-window-tag';
import { ErrorState, LoadingState, ReadError } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { formatDate } from '../../../lib/format';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useChangeFlag } from '../api/change-flag';
import { useAnalysisSettings } from '../../../lib/analysis-settings';
import { useParticipant } from '../../../lib/participant';
import { useVisit } from '../api/get-visit';
import { useVisitFlag } from '../api/get-visit-flag';
import { useVisitOverride } from '../api/get-visit-override';
import { useVisitRecordings } from '../api/get-visit-recordings';
import { useVisitReport } from '../api/get-visit-report';
import { useVisitBlinding, useRecordBlindedDecision } from '../api/get-visit-blinding';
import { useVisitReview } from '../api/get-visit-review';
import { useMarkVisitReviewed } from '../api/mark-visit-reviewed';
import { useSaveVisitOverride } from '../api/save-visit-override';
import { channelOptionsOf } from './channel-names';
import { BlindedDecisionCard } from './blinded-decision-card';
import { BlindedReviewHeader } from './blinded-review-header';
import { ChannelTable } from './channel-table';
import { ConditionsTable } from './conditions-table';
import { CycleEstimate } from './cycle-estimate';
import { FlagPanel } from './flag-panel';
import { QualityOf, ResultsOf, RunResultsOf } from './kind-results';
import { OnsetCurveChart } from './onset-curve-chart';
import { OverrideCard } from './override-card';
import { OverrideForm } from './override-form';
import { PersonName } from './person-name';
import { RestSpectrumChart } from './rest-spectrum-chart';
import { LoadedCard, ReviewCard } from './review-card';
import { ReviewMark } from './review-mark';
import { ScalpMaps } from './scalp-map';
import { useShownResults } from './shown-results';
import { TrialRaster } from './trial-raster';
import { VisitSources } from './visit-sources';
import { VisitTimeProvider } from './visit-time';
import '../review.css';

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
  const raiseFlag = useChangeFlag(visitId, 'raise');
  const clearFlag = useChangeFlag(visitId, 'clear');
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
  // What each results card offers when its run's numbers are in doubt.
  const rerunChoices = { canRerun, onChooseChannels: openOverride };

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
    <VisitTimeProvider blinded={blinded}>
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
        <ReadError read={recordings} title="The recordings could not be loaded" />
      ) : recordings.data === undefined ? (
        <LoadingState label="Loading the recordings" rows={12} />
      ) : (
        <>
          <VisitSources task={task} rest={rest} all={recordings.data} />
          <Row gutter={[{ xs: 0, xl: 20 }, 20]}>
            <Col xs={24} xl={16}>
              <Flex vertical gap={20}>
                <ReviewCard title="Onset: task recording" label="Task results">
                  <RunResultsOf
                    recording={task}
                    kind="task"
                    {...rerunChoices}
                    drawnOf={(results) => results.task}
                    nothingDrawn="No onset curves were computed"
                  >
                    {(taskPart, results, recording) => (
                      <>
                        <CycleEstimate
                          run={results.run}
                          cycles={taskPart.cycles}
                          studyThresholdHz={settings.data?.cycleDisagreementHz ?? null}
                        />
                        <OnsetCurveChart
                          recordingId={recording.id}
                          runId={results.run.id}
                          task={taskPart}
                          roiLabel={roiLabelOf(results)}
                          roiAvailable={results.run.roiUsage.status !== 'none'}
                        />
                        <div className="gyre-above-lg">
                          <TrialRaster
                            recordingId={recording.id}
                            runId={results.run.id}
                            task={taskPart}
                            bandHz={results.run.bandHz}
                          />
                        </div>
                        <Descriptions
                          size="small"
                          className="gyre-above gyre-figures"
                          items={[
                            {
                              key: 'total',
                              label: 'Epochs',
                              children: String(taskPart.epochs.total),
                            },
                            {
                              key: 'kept',
                              label: 'Kept',
                              children: String(taskPart.epochs.kept),
                            },
                            {
                              key: 'dropped',
                              label: 'Dropped',
                              children:
                                Object.entries(taskPart.epochs.dropped)
                                  .filter(([, n]) => n > 0)
                                  .map(([why, n]) => `${n} ${EPOCH_DROP_WORDS[why] ?? why}`)
                                  .join(', ') || 'none',
                            },
                          ]}
                        />
                        <ConditionsTable task={taskPart} />
                      </>
                    )}
                  </RunResultsOf>
                </ReviewCard>
                <ReviewCard
                  title="Individual alpha frequency: resting recording"
                  label="Rest results"
                >
                  <RunResultsOf
                    recording={rest}
                    kind="resting"
                    {...rerunChoices}
                    drawnOf={(results) => results.rest}
                    nothingDrawn="No spectrum was computed"
                  >
                    {(restPart, results) => (
                      <RestSpectrumChart rest={restPart} roiLabel={roiLabelOf(results)} />
                    )}
                  </RunResultsOf>
                </ReviewCard>
                <ReviewCard title="Per channel: task" label="Per-channel results">
                  <ResultsOf recording={task} kind="task">
                    {(results) => (
                      <ChannelTable channels={results.channels} roiUsage={results.run.roiUsage} />
                    )}
                  </ResultsOf>
                </ReviewCard>
                <ReviewCard title="Scalp maps" label="Scalp maps">
                  <ScalpMaps rest={rest} task={task} />
                </ReviewCard>
                <ReviewCard title="Quality checks" label="Quality checks">
                  <Tabs
                    items={[
                      {
                        key: 'task',
                        label: 'Task',
                        children: <QualityOf recording={task} kind="task" />,
                      },
                      {
                        key: 'rest',
                        label: 'Rest',
                        children: <QualityOf recording={rest} kind="resting" />,
                      },
                    ]}
                  />
                </ReviewCard>
              </Flex>
            </Col>
            <Col xs={24} xl={8}>
              <Flex vertical gap={20}>
                {blinded && (
                  <BlindedDecisionCard blinding={blinding.data} onDecide={recordDecision} />
                )}
                {ability.can('read', 'VisitReview') && (
                  <LoadedCard
                    title="Review of this visit"
                    label="Review of this visit"
                    read={review}
                    failed="The review state could not be loaded"
                    rows={1}
                  >
                    {(reviewState) => (
                      <ReviewMark
                        state={reviewState}
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
                  </LoadedCard>
                )}
                <LoadedCard
                  title="Slowing flag"
                  label="Slowing flag"
                  read={flag}
                  failed="The flag could not be loaded"
                >
                  {(flagView) => (
                    <FlagPanel
                      flag={flagView}
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
                </LoadedCard>
                {canReadSettings && (
                  <LoadedCard
                    title="This visit's analysis choices"
                    label="Visit analysis choices"
                    read={override}
                    failed="The visit's choices could not be loaded"
                    rows={2}
                  >
                    {(visitOverride) => (
                      <OverrideCard
                        override={visitOverride}
                        study={settings.data}
                        canChange={canChangeOverride}
                        onChange={() => setOverrideOpen(true)}
                      />
                    )}
                  </LoadedCard>
                )}
                <LoadedCard
                  title="Report"
                  label="Report"
                  read={report}
                  failed="The report could not be loaded"
                  rows={1}
                >
                  {(visitReport) =>
                    visitReport === null ? (
                      'No report has been drafted for this visit yet.'
                    ) : reportPanel !== undefined ? (
                      blinded ? (
                        'Sign-off opens once you have recorded your decision: reports are signed unblinded.'
                      ) : (
                        reportPanel(visitId, flag.data)
                      )
                    ) : (
                      <span>
                        <Tag>{visitReport.state}</Tag> The visit report is a {visitReport.state};
                        sign-off comes with the report screen.
                      </span>
                    )
                  }
                </LoadedCard>
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
    </VisitTimeProvider>
  );
}
