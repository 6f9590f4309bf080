import type { RecordingView } from '@gyre/shared';
import { App, Button, Card, Flex, Grid, Progress, Table, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { useState } from 'react';
import { GYRE_COLORS } from '../../../app/theme';
import { EmptyState, ErrorState, TableSkeleton } from '../../../components/page-states';
import { ApiError } from '../../../lib/api-client';
import {
  formatBytes,
  formatCount,
  formatDateTime,
  formatHz,
  formatSeconds,
} from '../../../lib/format';
import { useDownloadRecording } from '../api/download-recording';
import { useRetryRecording } from '../api/retry-recording';
import type { useLiveRecordings } from '../hooks/use-live-recordings';
import { KIND_LABELS } from './kind-labels';
import { recordingNotes } from './recording-notes';
import { RecordingStateTag } from './recording-state-tag';
import { RejectionText } from './rejection-text';
import { dateTimeColumn } from '../../../components/table-columns';
import '../intake.css';

/** States whose stored file can be downloaded (a rejected file is not kept). */
const DOWNLOADABLE: ReadonlySet<RecordingView['state']> = new Set([
  'queued',
  'computing',
  'ready',
  'failed',
  'superseded',
]);

/** The name the technician's file had; older recordings were stored without it. */
function FileName({ recording }: { recording: RecordingView }) {
  return recording.fileName === null ? (
    <Typography.Text type="secondary" italic>
      File name not kept
    </Typography.Text>
  ) : (
    <Typography.Text strong className="gyre-inherit-colour gyre-wrap-anywhere">
      {recording.fileName}
    </Typography.Text>
  );
}

function FileFacts({ recording }: { recording: RecordingView }) {
  const facts = recording.facts;
  if (facts === null) {
    return <Typography.Text type="secondary">{formatBytes(recording.sizeBytes)}</Typography.Text>;
  }
  const rates = [...new Set(facts.sampleRatesHz)];
  return (
    <Typography.Text className="gyre-figures gyre-inherit-colour gyre-caption">
      {facts.format} · {formatSeconds(facts.durationS)} · {facts.channelLabels.length} channels ·{' '}
      {rates.map((rate) => formatHz(rate)).join(', ')} · {formatBytes(recording.sizeBytes)}
      {facts.csvOnsetCount !== null && ` · ${facts.csvOnsetCount} onsets from CSV`}
      {facts.csvOnsetCount === null &&
        facts.annotationCount > 0 &&
        ` · ${facts.annotationCount} annotations`}
    </Typography.Text>
  );
}

/** The standing warnings, always in view: the participant may still be in the room. */
function Notes({ recording }: { recording: RecordingView }) {
  const notes = recordingNotes(recording);
  if (notes.length === 0) return null;
  return (
    <ul aria-label={`Warnings about the ${recording.kind} recording`} className="gyre-warning-list">
      {notes.map((note) => (
        <li key={note}>{note}</li>
      ))}
    </ul>
  );
}

function Replacement({ recording, all }: { recording: RecordingView; all: RecordingView[] }) {
  if (recording.state === 'superseded') {
    const newer = all.find((r) => r.id === recording.supersededById) ?? null;
    return (
      <Typography.Text type="secondary">
        Replaced
        {newer !== null && (
          <>
            {' '}
            by the upload of <span className="gyre-figures">{formatDateTime(newer.createdAt)}</span>
          </>
        )}
        {newer?.replacementReason ? <>: “{newer.replacementReason}”.</> : '.'} Kept for the record;
        never computed again.
      </Typography.Text>
    );
  }
  if (recording.replacesId === null) return null;
  const earlier = all.find((r) => r.id === recording.replacesId) ?? null;
  return (
    <div>
      <Typography.Text>
        Replaces{' '}
        {earlier === null ? (
          'an earlier upload'
        ) : (
          <>
            the upload of <span className="gyre-figures">{formatDateTime(earlier.createdAt)}</span>
          </>
        )}
        {recording.replacementReason ? <>: “{recording.replacementReason}”.</> : '.'}
      </Typography.Text>
    </div>
  );
}

function Progression({ recording, all }: { recording: RecordingView; all: RecordingView[] }) {
  let main: React.ReactNode = null;
  if (recording.state === 'queued') {
    main = (
      <Typography.Text type="secondary">
        Checked and kept; waiting for a free computation slot.
      </Typography.Text>
    );
  } else if (recording.state === 'computing') {
    main =
      recording.progressPercent === null ? (
        <Typography.Text type="secondary">Computing…</Typography.Text>
      ) : (
        <Progress
          percent={Math.round(recording.progressPercent)}
          size="small"
          status="active"
          aria-label={`Computation progress of the ${recording.kind} recording`}
        />
      );
  } else if (recording.state === 'received' || recording.state === 'validating') {
    main = <Typography.Text type="secondary">The file is being checked.</Typography.Text>;
  } else if (recording.state === 'rejected' && recording.rejection !== null) {
    return <RejectionText rejection={recording.rejection} sizeBytes={recording.sizeBytes} />;
  } else if (recording.state === 'failed') {
    main = (
      <Typography.Text>{recording.failureMessage ?? 'The computation stopped.'}</Typography.Text>
    );
  } else if (recording.state === 'superseded') {
    return <Replacement recording={recording} all={all} />;
  }
  return (
    <>
      {main}
      <Replacement recording={recording} all={all} />
      <Notes recording={recording} />
    </>
  );
}

/**
 * The visit's recordings with their state, followed live while any is on its way (the caller
 * owns the live list: `useLiveRecordings`). A rejected row can be dismissed from this view.
 */
export function RecordingsTable({
  recordings,
  dismissed,
  onDismiss,
}: {
  recordings: ReturnType<typeof useLiveRecordings>;
  /** Rejected recordings this user dismissed from the view (the server keeps them). */
  dismissed: ReadonlySet<string>;
  onDismiss: (recordingId: string) => void;
}) {
  const { data, error, isLoading, mutate } = recordings;
  const [showDismissed, setShowDismissed] = useState(false);
  const retry = useRetryRecording();
  const download = useDownloadRecording();
  const [downloading, setDownloading] = useState<string | null>(null);
  const { message } = App.useApp();
  const screens = Grid.useBreakpoint();
  const all = data?.items ?? [];
  const hidden = all.filter((r) => r.state === 'rejected' && dismissed.has(r.id));
  const shown = showDismissed ? all : all.filter((r) => !hidden.includes(r));
  // Below `lg` the upload time moves under the kind, so a narrow screen still tells them apart.
  const wide = screens.lg === true;

  const startDownload = async (recording: RecordingView) => {
    setDownloading(recording.id);
    try {
      await download(recording);
    } catch (caught) {
      message.error(
        caught instanceof ApiError ? caught.message : 'The file could not be downloaded.',
      );
    } finally {
      setDownloading(null);
    }
  };

  const actions = (recording: RecordingView, direction: 'row' | 'column') => (
    <Flex vertical={direction === 'column'} gap={6} align="flex-start">
      {DOWNLOADABLE.has(recording.state) && (
        <Button
          size="small"
          loading={downloading === recording.id}
          aria-label={`Download the ${recording.state === 'superseded' ? 'superseded ' : ''}${recording.kind} recording uploaded ${formatDateTime(recording.createdAt)}`}
          onClick={() => void startDownload(recording)}
        >
          Download
        </Button>
      )}
      {recording.state === 'rejected' && !dismissed.has(recording.id) && (
        <Button
          size="small"
          aria-label={`Dismiss the rejected ${recording.fileName ?? `${recording.kind} recording`}`}
          onClick={() => onDismiss(recording.id)}
        >
          Dismiss
        </Button>
      )}
      {recording.state === 'failed' && (
        <Button
          size="small"
          onClick={() =>
            void retry(recording).then(
              () => message.success('The computation is queued again.'),
              (caught: unknown) =>
                message.error(caught instanceof ApiError ? caught.message : 'Retry failed.'),
            )
          }
        >
          Retry
        </Button>
      )}
    </Flex>
  );

  const kindAndState = (recording: RecordingView) => (
    <>
      <Typography.Text strong className="gyre-inherit-colour">
        {KIND_LABELS[recording.kind]}
      </Typography.Text>
      <RecordingStateTag recording={recording} />
    </>
  );

  // A phone gets one column per recording, its words at full width; wider screens a table.
  const columns: TableColumnsType<RecordingView> =
    screens.md === false
      ? [
          {
            title: 'Recordings',
            key: 'recording',
            render: (_, recording) => (
              <Flex vertical gap={6}>
                <Flex justify="space-between" align="center" gap={8} wrap>
                  <Flex gap={8} align="center" wrap>
                    {kindAndState(recording)}
                  </Flex>
                  {actions(recording, 'row')}
                </Flex>
                <FileName recording={recording} />
                <Typography.Text type="secondary" className="gyre-figures gyre-caption">
                  Uploaded {formatDateTime(recording.createdAt)}
                </Typography.Text>
                <Progression recording={recording} all={all} />
              </Flex>
            ),
          },
        ]
      : [
          {
            title: 'Recording',
            key: 'recording',
            width: 150,
            render: (_, recording) => (
              <Flex vertical gap={4} align="flex-start">
                {kindAndState(recording)}
                {!wide && (
                  <Typography.Text type="secondary" className="gyre-figures gyre-caption">
                    {formatDateTime(recording.createdAt)}
                  </Typography.Text>
                )}
              </Flex>
            ),
          },
          {
            title: 'File',
            key: 'facts',
            width: 240,
            render: (_, recording) => (
              <Flex vertical gap={2}>
                <FileName recording={recording} />
                <FileFacts recording={recording} />
              </Flex>
            ),
          },
          {
            title: 'Progress, warnings or reason',
            key: 'progress',
            render: (_, recording) => <Progression recording={recording} all={all} />,
          },
          { ...dateTimeColumn<RecordingView>('Uploaded', 'createdAt', 180), responsive: ['lg'] },
          {
            title: '',
            key: 'actions',
            width: 110,
            render: (_, recording) => actions(recording, 'column'),
          },
        ];

  return (
    <Card title="Recordings of this visit">
      {error !== undefined ? (
        <ErrorState
          error={error}
          onRetry={() => void mutate()}
          title="The recordings could not be loaded"
        />
      ) : (
        <Table<RecordingView>
          rowKey="id"
          size={wide ? 'middle' : 'small'}
          loading={isLoading && data !== undefined}
          columns={columns}
          dataSource={shown}
          pagination={false}
          // A superseded recording stays listed for the record, but set back.
          onRow={(recording) =>
            recording.state === 'superseded'
              ? { style: { background: GYRE_COLORS.mist, color: 'rgba(29, 43, 47, 0.6)' } }
              : {}
          }
          locale={{
            emptyText: isLoading ? (
              <TableSkeleton />
            ) : (
              <EmptyState description="No recordings yet. Drop the visit's EDF files above." />
            ),
          }}
        />
      )}
      {hidden.length > 0 && (
        <Button
          type="link"
          className="gyre-inline-link gyre-above-xs"
          onClick={() => setShowDismissed((on) => !on)}
        >
          {showDismissed
            ? 'Hide dismissed rejected uploads'
            : `Show ${formatCount(hidden.length, 'dismissed rejected upload')}`}
        </Button>
      )}
    </Card>
  );
}
