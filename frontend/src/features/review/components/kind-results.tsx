import type { RecordingKind, RecordingResultsView, RecordingView } from '@gyre/shared';
import { Skeleton } from 'antd';
import { EmptyState, ReadError } from '../../../components/page-states';
import { QualityChecks } from './quality-checks';
import { RecordingStateNotice } from './recording-state-notice';
import { RunNotices } from './run-notices';
import { RunSummary } from './run-summary';
import { IN_PROGRESS, useShownResults } from './shown-results';

/**
 * One kind of recording's results, or why there are none yet. While a re-run is on its way
 * the last results stay on screen under a notice, so the analyst never loses the picture.
 */
export function ResultsOf({
  recording,
  kind,
  children,
}: {
  recording: RecordingView | null;
  kind: RecordingKind;
  children: (results: RecordingResultsView, recording: RecordingView) => React.ReactNode;
}) {
  const { showable, results } = useShownResults(recording);
  if (recording === null) {
    return <EmptyState description={`No ${kind} recording for this visit yet.`} />;
  }
  if (!showable) {
    return recording.state === 'ready' ? (
      <EmptyState description="No computed results yet." />
    ) : (
      <RecordingStateNotice recording={recording} />
    );
  }
  if (results.error !== undefined) {
    return <ReadError read={results} title={`The ${kind} results could not be loaded`} />;
  }
  if (results.data === undefined) return <Skeleton active paragraph={{ rows: 6 }} />;
  return (
    <>
      {IN_PROGRESS.has(recording.state) && (
        <div className="gyre-below-sm">
          <RecordingStateNotice recording={recording} previousShown />
        </div>
      )}
      {children(results.data, recording)}
    </>
  );
}

/**
 * A results card's body: the run's notices and headline numbers, then what the run drew (its
 * task or rest part, `drawnOf`), or `nothingDrawn` and a pointer to the quality checks. With no
 * region channel left the notices already say why nothing was drawn.
 */
export function RunResultsOf<Drawn>({
  recording,
  kind,
  canRerun,
  onChooseChannels,
  drawnOf,
  nothingDrawn,
  children,
}: {
  recording: RecordingView | null;
  kind: RecordingKind;
  canRerun: boolean;
  onChooseChannels?: () => void;
  drawnOf: (results: RecordingResultsView) => Drawn | null;
  nothingDrawn: string;
  children: (
    drawn: Drawn,
    results: RecordingResultsView,
    recording: RecordingView,
  ) => React.ReactNode;
}) {
  return (
    <ResultsOf recording={recording} kind={kind}>
      {(results, shown) => {
        const drawn = drawnOf(results);
        return (
          <>
            <RunNotices
              results={results}
              recording={shown}
              canRerun={canRerun}
              onChooseChannels={onChooseChannels}
            />
            <RunSummary run={results.run} />
            {drawn === null
              ? results.run.roiUsage.status !== 'none' && (
                  <EmptyState
                    description={`${nothingDrawn} for this run; the quality checks below say what the file held.`}
                  />
                )
              : children(drawn, results, shown)}
          </>
        );
      }}
    </ResultsOf>
  );
}

/** The quality checks of one kind's current run. */
export function QualityOf({
  recording,
  kind,
}: {
  recording: RecordingView | null;
  kind: RecordingKind;
}) {
  return (
    <ResultsOf recording={recording} kind={kind}>
      {(results, shown) => (
        <QualityChecks
          quality={results.quality}
          kind={kind}
          roiUsage={results.run.roiUsage}
          lineFrequencyHz={shown.lineFrequencyHz}
        />
      )}
    </ResultsOf>
  );
}
