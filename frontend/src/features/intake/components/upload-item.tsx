import type {
  KindMismatchDetails,
  KindTakenDetails,
  RecordingView,
  RecordingKind,
  RecordingRejection,
} from '@gyre/shared';
import { Alert, Button, Checkbox, Flex, Form, Input, Progress, Typography } from 'antd';
import { useState } from 'react';
import { formatBytes, formatDateTime } from '../../../lib/format';
import { useRecordings } from '../api/recordings';
import { KIND_LABELS } from './kind-labels';
import { recordingNotes } from './recording-notes';
import { RecordingStateTag } from './recording-state-tag';
import { RejectionText } from './rejection-text';
import '../intake.css';

export const REPLACEMENT_REASON_MIN_LENGTH = 10;

/** One dropped file, from its upload to the server's answer and what the technician did about it. */
export interface UploadItem {
  uid: string;
  name: string;
  sizeBytes: number;
  /** Null for a file refused before sending (nothing to send again). */
  file: File | null;
  onsets: File | null;
  kind: RecordingKind;
  confirmKind: boolean;
  replaces: { recordingId: string; reason: string } | null;
  percent: number;
  status:
    | 'uploading'
    | 'accepted'
    | 'rejected'
    | 'error'
    | 'kind-unconfirmed'
    | 'kind-taken'
    | 'dismissed';
  rejection?: RecordingRejection;
  message?: string;
  mismatch?: KindMismatchDetails;
  taken?: KindTakenDetails;
  /** The recording the server made of it (accepted, or kept as rejected evidence). */
  recordingId?: string;
}

export type Resend = (next: UploadItem) => void;

const otherKind = (kind: RecordingKind): RecordingKind => (kind === 'resting' ? 'task' : 'resting');
const lower = (kind: RecordingKind) => KIND_LABELS[kind].toLowerCase();

/** The server's sentence without its leading field name (`kind: …`), as a sentence. */
function plainSentence(text: string): string {
  const body = text.replace(/^kind:\s*/i, '');
  return body.charAt(0).toUpperCase() + body.slice(1);
}

/**
 * The file looks like the other kind: say what was found, then let the technician send it as
 * the other kind, or confirm this kind explicitly.
 */
function KindMismatch({ item, onResend }: { item: UploadItem; onResend: Resend }) {
  const [confirmed, setConfirmed] = useState(false);
  const mismatch = item.mismatch;
  if (mismatch === undefined) return null;
  const other = otherKind(item.kind);
  return (
    <section aria-label={`Kind of ${item.name}`} className="gyre-upload-followup">
      <div role="alert">
        <Typography.Text strong className="gyre-warning-text">
          Not kept yet: this file looks like a {lower(other)} recording.{' '}
        </Typography.Text>
        <Typography.Text>{plainSentence(item.message ?? '')}</Typography.Text>
        <br />
        <Typography.Text type="secondary" className="gyre-caption">
          Chosen: {lower(item.kind)} · found {mismatch.found} · expected {mismatch.expected}
        </Typography.Text>
      </div>
      <Flex vertical gap={8} align="flex-start" className="gyre-above-xs">
        <Button
          onClick={() =>
            onResend({
              ...item,
              kind: other,
              confirmKind: false,
              // The onset CSV and a replacement belonged to the kind first chosen.
              onsets: null,
              replaces: null,
            })
          }
        >
          Send it as a {lower(other)} recording
        </Button>
        <Checkbox checked={confirmed} onChange={(event) => setConfirmed(event.target.checked)}>
          I confirm that this is a {lower(item.kind)} recording, although the file holds{' '}
          {mismatch.found}.
        </Checkbox>
        <Button
          type="primary"
          disabled={!confirmed}
          onClick={() => onResend({ ...item, confirmKind: true })}
        >
          Send as {lower(item.kind)}, kind confirmed
        </Button>
      </Flex>
    </section>
  );
}

/**
 * The visit already has a current recording of this kind: replacing it needs a reason; the
 * earlier one stays listed, superseded.
 */
function KindTaken({
  item,
  visitId,
  onResend,
  onDismiss,
}: {
  item: UploadItem;
  visitId: string;
  onResend: Resend;
  onDismiss: () => void;
}) {
  const [replacing, setReplacing] = useState(false);
  const [form] = Form.useForm<{ reason: string }>();
  // Read from the cache the screen keeps live; no timer of its own.
  const recordings = useRecordings(visitId, { refreshInterval: 0 });
  const taken = item.taken;
  if (taken === undefined) return null;
  const earlier = recordings.data?.items.find((r) => r.id === taken.recordingId) ?? null;
  return (
    <section
      aria-label={`Replace the ${lower(taken.kind)} recording`}
      className="gyre-upload-followup"
    >
      <div role="alert">
        <Typography.Text strong className="gyre-warning-text">
          Not sent on: this visit already has a {lower(taken.kind)} recording
          {earlier !== null && <>, uploaded {formatDateTime(earlier.createdAt)}</>}.{' '}
        </Typography.Text>
        <Typography.Text>
          A visit keeps one current {lower(taken.kind)} recording. Replace it only if this file
          should be used instead.
        </Typography.Text>
      </div>
      {!replacing ? (
        <Flex gap={8} wrap className="gyre-above-xs">
          <Button onClick={() => setReplacing(true)}>Replace it</Button>
          <Button type="text" onClick={onDismiss}>
            Keep the earlier recording
          </Button>
        </Flex>
      ) : (
        <Form
          form={form}
          layout="vertical"
          requiredMark={false}
          className="gyre-above-xs"
          aria-label={`Why replace the ${lower(taken.kind)} recording`}
          onFinish={({ reason }) =>
            onResend({
              ...item,
              replaces: { recordingId: taken.recordingId, reason: reason.trim() },
            })
          }
        >
          <Form.Item
            name="reason"
            label={`Why replace the earlier ${lower(taken.kind)} recording?`}
            extra="The earlier recording stays listed and downloadable, marked superseded."
            rules={[
              { required: true, whitespace: true, message: 'A reason is required.' },
              {
                validator: async (_rule, value: string | undefined) => {
                  const length = (value ?? '').trim().length;
                  if (length > 0 && length < REPLACEMENT_REASON_MIN_LENGTH) {
                    throw new Error(
                      `Write at least ${REPLACEMENT_REASON_MIN_LENGTH} characters (${length} so far).`,
                    );
                  }
                },
              },
            ]}
          >
            <Input.TextArea rows={2} maxLength={2000} />
          </Form.Item>
          <Flex gap={8} wrap>
            <Button type="primary" htmlType="submit">
              Replace and send
            </Button>
            <Button onClick={() => setReplacing(false)}>Cancel</Button>
          </Flex>
        </Form>
      )}
    </section>
  );
}

/** An accepted upload's recording as it goes on: queued, computing (with percent), then done. */
function AcceptedState({ item, recording }: { item: UploadItem; recording?: RecordingView }) {
  const notes = recording === undefined ? [] : recordingNotes(recording);
  let now: React.ReactNode = null;
  if (recording?.state === 'queued') {
    now = 'The computation is queued; it starts when a computation slot is free.';
  } else if (recording?.state === 'computing') {
    now =
      recording.progressPercent === null ? (
        'Computing…'
      ) : (
        <Progress
          percent={Math.round(recording.progressPercent)}
          size="small"
          status="active"
          aria-label={`Computation of ${item.name}`}
        />
      );
  } else if (recording?.state === 'ready') {
    now = notes.length > 0 ? 'Computed, with warnings:' : 'Computed: the results are ready.';
  } else if (recording?.state === 'failed') {
    now = `The computation failed: ${recording.failureMessage ?? 'no reason given'}. Retry it in the list below.`;
  } else if (recording?.state === 'superseded') {
    now = 'A newer upload replaced it.';
  }
  return (
    <div aria-live="polite">
      <Flex gap={8} align="center" wrap>
        <Typography.Text type="success">Received and checked.</Typography.Text>
        {recording !== undefined && <RecordingStateTag recording={recording} />}
      </Flex>
      {recording === undefined && (
        <Typography.Text type="secondary">The computation is queued.</Typography.Text>
      )}
      {now !== null && <div>{now}</div>}
      {notes.length > 0 && (
        <ul aria-label={`Warnings about ${item.name}`} className="gyre-warning-list">
          {notes.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      )}
      {item.replaces !== null && (
        <Typography.Text type="secondary">
          It replaces the earlier recording, which stays listed as superseded.{' '}
        </Typography.Text>
      )}
      {item.confirmKind && (
        <Typography.Text type="secondary">
          The confirmed kind stays on the recording as a warning.
        </Typography.Text>
      )}
    </div>
  );
}

/** One line of the upload list: progress, the server's answer, and any choice it asks for. */
export function UploadItemView({
  item,
  visitId,
  onResend,
  onDismiss,
  recording,
  onClear,
}: {
  item: UploadItem;
  visitId: string;
  onResend: Resend;
  onDismiss: () => void;
  /** The recording made of this upload, as the screen follows it live. */
  recording?: RecordingView;
  /** Takes a refused upload off the list (and its rejected recording off the view). */
  onClear: () => void;
}) {
  return (
    <li className="gyre-upload-item" data-upload-status={item.status}>
      <Flex justify="space-between" gap={16} wrap>
        <Typography.Text strong className="gyre-break-all">
          {item.name}
        </Typography.Text>
        <Typography.Text type="secondary" className="gyre-figures">
          {item.kind} · {formatBytes(item.sizeBytes)}
        </Typography.Text>
      </Flex>
      {item.status === 'uploading' && (
        <Progress
          percent={Math.round(item.percent)}
          size="small"
          status="active"
          aria-label={`Upload of ${item.name}`}
        />
      )}
      {item.status === 'accepted' && <AcceptedState item={item} recording={recording} />}
      {item.status === 'rejected' && item.rejection !== undefined && (
        <div role="alert">
          <Typography.Text type="danger" strong>
            Not accepted.{' '}
          </Typography.Text>
          <RejectionText rejection={item.rejection} sizeBytes={item.sizeBytes} />
        </div>
      )}
      {item.status === 'error' && (
        <Typography.Text type="danger" role="alert">
          {item.message}
        </Typography.Text>
      )}
      {(item.status === 'rejected' || item.status === 'error') && (
        <Button
          size="small"
          className="gyre-upload-followup"
          aria-label={`Dismiss ${item.name}`}
          onClick={onClear}
        >
          Dismiss
        </Button>
      )}
      {item.status === 'kind-unconfirmed' && <KindMismatch item={item} onResend={onResend} />}
      {item.status === 'kind-taken' && (
        <KindTaken item={item} visitId={visitId} onResend={onResend} onDismiss={onDismiss} />
      )}
      {item.status === 'dismissed' && (
        <Alert
          type="info"
          showIcon
          className="gyre-upload-followup"
          title="Not sent; the earlier recording stays the visit's current one."
        />
      )}
    </li>
  );
}
