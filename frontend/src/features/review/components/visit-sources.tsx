import type { RecordingView, RecordingKind, RecordingResultsView } from '@gyre/shared';
import { Flex, Typography } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { roiUsageSentence } from '../../../lib/roi-usage';
import { depthSettingsWords, TRIGGER_WORDS } from './run-words';
import { useShownResults } from './shown-results';
import { useVisitTime } from './visit-time';

const KIND_NAMES: Record<RecordingKind, string> = { task: 'task', resting: 'resting' };
const OTHER_KIND: Record<RecordingKind, RecordingKind> = { task: 'resting', resting: 'task' };

function Doubt({ children }: { children: React.ReactNode }) {
  return <div style={{ color: GYRE_COLORS.amberText }}>{children}</div>;
}

/** Which earlier recording this one replaced, and why. */
function Replaced({
  recording,
  replacesId,
  reason,
  all,
}: {
  recording: RecordingView;
  replacesId: string | null;
  reason: string | null;
  all: RecordingView[];
}) {
  const visitTime = useVisitTime();
  if (replacesId === null) return null;
  const earlier = all.find((r) => r.id === replacesId) ?? null;
  return (
    <div>
      It replaced an earlier {KIND_NAMES[recording.kind]} recording
      {earlier !== null && (
        <>
          {' '}
          uploaded <span className="gyre-figures">{visitTime(earlier.createdAt)}</span>
        </>
      )}
      , now superseded{reason ? <>: “{reason}”</> : '.'}
    </div>
  );
}

function SourceLine({
  kind,
  recording,
  all,
}: {
  kind: RecordingKind;
  recording: RecordingView | null;
  all: RecordingView[];
}) {
  const { showable, results } = useShownResults(recording);
  const visitTime = useVisitTime();
  const label = kind === 'task' ? 'Task' : 'Resting';
  if (recording === null) {
    return (
      <div>
        <Typography.Text strong>{label}: </Typography.Text>no recording yet.
      </div>
    );
  }
  const data: RecordingResultsView | undefined = showable ? results.data : undefined;
  return (
    <div data-testid={`source-${kind}`}>
      {data === undefined ? (
        <div>
          <Typography.Text strong>{label}: </Typography.Text>
          {showable ? 'loading…' : `no numbers yet (the recording is ${recording.state}).`}
        </div>
      ) : (
        <div>
          <Typography.Text strong>{label}: </Typography.Text>
          the recording uploaded{' '}
          <span className="gyre-figures">{visitTime(data.source.uploadedAt)}</span> (SHA-256{' '}
          <span className="gyre-figures">{data.source.checksumSha256.slice(0, 12)}…</span>),
          computed <span className="gyre-figures">{visitTime(data.run.createdAt)}</span>,{' '}
          {TRIGGER_WORDS[data.run.trigger]}, settings version {data.run.settingsVersion}
          {data.run.overrideRevision !== null &&
            ` with this visit's own choices (revision ${data.run.overrideRevision})`}
          {data.run.kind === 'task' && (
            <span data-testid="depth-settings">
              {' '}
              ({depthSettingsWords(data.run.depthSettings)})
            </span>
          )}
          .
        </div>
      )}
      <Replaced
        recording={recording}
        replacesId={data?.source.replacesId ?? recording.replacesId}
        reason={data?.source.replacementReason ?? recording.replacementReason}
        all={all}
      />
      {recording.kindConfirmed && (
        <Doubt>
          The technician confirmed the kind although the file looked like a{' '}
          {KIND_NAMES[OTHER_KIND[kind]]} recording.
        </Doubt>
      )}
      {data !== undefined && data.run.roiUsage.status !== 'complete' && (
        <Doubt>{roiUsageSentence(data.run.roiUsage)}</Doubt>
      )}
    </div>
  );
}

/** The Review header's account of which recordings the visit's numbers come from. */
export function VisitSources({
  task,
  rest,
  all,
}: {
  task: RecordingView | null;
  rest: RecordingView | null;
  all: RecordingView[];
}) {
  return (
    <section
      aria-label="Where these numbers come from"
      style={{
        background: GYRE_COLORS.paper,
        border: `1px solid ${GYRE_COLORS.line}`,
        borderRadius: 6,
        padding: '10px 14px',
        marginBottom: 20,
      }}
    >
      <Typography.Text type="secondary" className="gyre-caption-caps">
        WHERE THESE NUMBERS COME FROM
      </Typography.Text>
      <Flex vertical gap={8} style={{ marginTop: 4 }}>
        <SourceLine kind="task" recording={task} all={all} />
        <SourceLine kind="resting" recording={rest} all={all} />
      </Flex>
    </section>
  );
}
