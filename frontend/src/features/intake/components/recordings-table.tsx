import type { RecordingDto } from '@gyre/shared';
import { App, Button, Card, Progress, Table, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { EmptyState, ErrorState, TableSkeleton } from '../../../components/page-states';
import { ApiError } from '../../../lib/api-client';
import { formatBytes, formatDateTime, formatHz, formatSeconds } from '../../../lib/format';
import { useRecordings } from '../api/recordings';
import { useRetryRecording } from '../api/retry-recording';
import { RecordingStateTag } from './recording-state-tag';
import { RejectionText } from './rejection-text';

const KIND_LABELS = { resting: 'Resting', task: 'Task' } as const;

function FileFacts({ recording }: { recording: RecordingDto }) {
  const facts = recording.facts;
  if (facts === null) {
    return <Typography.Text type="secondary">{formatBytes(recording.sizeBytes)}</Typography.Text>;
  }
  const rates = [...new Set(facts.sampleRatesHz)];
  return (
    <Typography.Text className="gyre-figures">
      {facts.format} · {formatSeconds(facts.durationS)} · {facts.channelLabels.length} channels ·{' '}
      {rates.map((rate) => formatHz(rate)).join(', ')} · {formatBytes(recording.sizeBytes)}
      {facts.csvOnsetCount !== null && ` · ${facts.csvOnsetCount} onsets from CSV`}
      {facts.csvOnsetCount === null &&
        facts.annotationCount > 0 &&
        ` · ${facts.annotationCount} annotations`}
    </Typography.Text>
  );
}

function Progression({ recording }: { recording: RecordingDto }) {
  if (recording.state === 'queued' || recording.state === 'computing') {
    return (
      <Progress
        percent={Math.round(recording.progressPercent ?? 0)}
        size="small"
        status="active"
        aria-label={`Computation progress of the ${recording.kind} recording`}
      />
    );
  }
  if (recording.state === 'rejected' && recording.rejection !== null) {
    return <RejectionText rejection={recording.rejection} />;
  }
  if (recording.state === 'failed') {
    return (
      <Typography.Text>{recording.failureMessage ?? 'The computation stopped.'}</Typography.Text>
    );
  }
  if (
    recording.state === 'ready' &&
    recording.facts !== null &&
    recording.facts.warnings.length > 0
  ) {
    return (
      <Typography.Text style={{ color: '#C77C02' }}>
        {recording.facts.warnings.join(' ')}
      </Typography.Text>
    );
  }
  return null;
}

/** The visit's recordings with their state, asked again while any is on its way. */
export function RecordingsTable({ visitId }: { visitId: string }) {
  const { data, error, isLoading, mutate } = useRecordings(visitId);
  const retry = useRetryRecording();
  const { message } = App.useApp();

  const columns: TableColumnsType<RecordingDto> = [
    {
      title: 'Kind',
      dataIndex: 'kind',
      width: 90,
      render: (kind: RecordingDto['kind']) => KIND_LABELS[kind],
    },
    { title: 'File', key: 'facts', render: (_, recording) => <FileFacts recording={recording} /> },
    {
      title: 'State',
      dataIndex: 'state',
      width: 110,
      render: (state: RecordingDto['state']) => <RecordingStateTag state={state} />,
    },
    {
      title: 'Progress or reason',
      key: 'progress',
      width: 340,
      render: (_, recording) => <Progression recording={recording} />,
    },
    {
      title: 'Uploaded',
      dataIndex: 'createdAt',
      width: 180,
      render: (at: string) => <span className="gyre-figures">{formatDateTime(at)}</span>,
    },
    {
      title: '',
      key: 'actions',
      width: 90,
      render: (_, recording) =>
        recording.state === 'failed' ? (
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
        ) : null,
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
        <Table<RecordingDto>
          rowKey="id"
          size="middle"
          loading={isLoading && data !== undefined}
          columns={columns}
          dataSource={data?.items ?? []}
          pagination={false}
          locale={{
            emptyText: isLoading ? (
              <TableSkeleton />
            ) : (
              <EmptyState description="No recordings yet. Drop the visit's EDF files above." />
            ),
          }}
        />
      )}
    </Card>
  );
}
