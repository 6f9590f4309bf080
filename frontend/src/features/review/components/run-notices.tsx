import type { RecordingView, RecordingResultsView } from '@gyre/shared';
import { Alert, Button, Flex } from 'antd';
import { NO_ROI_CHANNEL_REMAINS, leftOutText, roiUsageSentence } from '../../../lib/roi-usage';
import { useRerunRecording } from '../api/rerun-recording';
import { REST_CHANGED_NOTICE } from './run-words';

/** A notice's button, under its words (beside them, long words would be squeezed on a phone). */
function NoticeAction({ label, onClick }: { label: string; onClick: () => void }) {
  return (
    <div className="gyre-above-xs">
      <Button size="small" onClick={onClick}>
        {label}
      </Button>
    </div>
  );
}

/**
 * Everything that makes a run's numbers doubtful or different from what the analyst might
 * assume, above those numbers: channels left out of the region of interest, an automatic
 * recomputation, and settings that would now compute something else.
 */
export function RunNotices({
  results,
  recording,
  canRerun,
  onChooseChannels,
}: {
  results: RecordingResultsView;
  recording: RecordingView;
  canRerun: boolean;
  /** Opens the visit's override form; absent for someone who may not change it. */
  onChooseChannels?: () => void;
}) {
  const rerun = useRerunRecording();
  const { run } = results;
  const usage = run.roiUsage;
  return (
    <Flex vertical gap={8} className="gyre-below-sm">
      {usage.status === 'none' && (
        <Alert
          type="warning"
          showIcon
          role="alert"
          title={NO_ROI_CHANNEL_REMAINS}
          description={
            <>
              {usage.leftOut.length === 0
                ? 'The region of interest names no channel.'
                : `Left out: ${leftOutText(usage.leftOut)}.`}{' '}
              There is no region-of-interest result for this{' '}
              {run.kind === 'task' ? 'task' : 'resting'} recording.
              {onChooseChannels && (
                <NoticeAction label="Choose channels and re-run" onClick={onChooseChannels} />
              )}
            </>
          }
        />
      )}
      {usage.status === 'partial' && (
        <Alert
          type="warning"
          showIcon
          title={roiUsageSentence(usage)}
          description={
            onChooseChannels && <NoticeAction label="Choose channels" onClick={onChooseChannels} />
          }
        />
      )}
      {run.trigger === 'rest-changed' && <Alert type="info" showIcon title={REST_CHANGED_NOTICE} />}
      {run.staleSettings.length > 0 && (
        <Alert
          type="info"
          showIcon
          aria-label="Computed with older settings"
          title="Computed with older settings: the current ones would compute this differently."
          description={
            <>
              <ul className="gyre-compact-list gyre-figures">
                {run.staleSettings.map((phrase) => (
                  <li key={phrase}>{phrase}</li>
                ))}
              </ul>
              {canRerun && (
                <NoticeAction
                  label="Re-run with the current settings"
                  onClick={() =>
                    void rerun(
                      recording,
                      `Bring up to the current settings: ${run.staleSettings.join('; ')}`,
                    )
                  }
                />
              )}
            </>
          }
        />
      )}
    </Flex>
  );
}
