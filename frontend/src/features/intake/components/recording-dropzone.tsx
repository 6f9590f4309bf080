import type {
  KindMismatchDetails,
  KindTakenDetails,
  RecordingView,
  RecordingKind,
} from '@gyre/shared';
import { RECORDING_KINDS } from '@gyre/shared';
import { Button, Card, Flex, Form, Grid, Segmented, Typography, Upload } from 'antd';
import type { UploadFile, UploadProps } from 'antd';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { KIND_TAKEN, KIND_UNCONFIRMED, useUploadRecording } from '../api/upload-recording';
import { rejectionFromDetails } from './rejection-text';
import { UploadItemView, type UploadItem } from './upload-item';
import '../intake.css';

const EDF_NAME = /\.(edf|bdf|rec)$/i;
const CSV_NAME = /\.csv$/i;

function isKind(value: unknown): value is RecordingKind {
  return typeof value === 'string' && (RECORDING_KINDS as readonly string[]).includes(value);
}

/** The details of a 422 `RECORDING_KIND_UNCONFIRMED`, when they have the expected shape. */
export function kindMismatchOf(
  details: Record<string, unknown> | null,
): KindMismatchDetails | null {
  if (
    details === null ||
    !isKind(details.kind) ||
    typeof details.onsetCount !== 'number' ||
    typeof details.found !== 'string' ||
    typeof details.expected !== 'string'
  ) {
    return null;
  }
  return {
    kind: details.kind,
    onsetCount: details.onsetCount,
    found: details.found,
    expected: details.expected,
  };
}

/** The details of a 409 `RECORDING_KIND_TAKEN`, when they have the expected shape. */
export function kindTakenOf(details: Record<string, unknown> | null): KindTakenDetails | null {
  if (details === null || !isKind(details.kind) || typeof details.recordingId !== 'string') {
    return null;
  }
  return { kind: details.kind, recordingId: details.recordingId };
}

/** The id of the rejected recording a 422 carries in `details.recording`, when it does. */
function rejectedRecordingId(details: Record<string, unknown> | null): string | undefined {
  const recording = details?.recording;
  return typeof recording === 'object' &&
    recording !== null &&
    'id' in recording &&
    typeof recording.id === 'string'
    ? recording.id
    : undefined;
}

/**
 * Drop one or more EDF/EDF+ or BDF/BDF+ files (and, for a task, an onset CSV); each shows its upload
 * progress, the server's answer, then its recording's state live (from `recordings`).
 */
export function RecordingDropzone({
  visitId,
  visitName,
  recordings,
  onDismissRecording,
}: {
  visitId: string;
  visitName: string;
  /** The visit's recordings as the screen follows them live. */
  recordings: readonly RecordingView[];
  /** Hides a rejected recording from the list below too. */
  onDismissRecording: (recordingId: string) => void;
}) {
  const upload = useUploadRecording();
  const screens = Grid.useBreakpoint();
  const [kind, setKind] = useState<RecordingKind>('resting');
  const [onsets, setOnsets] = useState<UploadFile[]>([]);
  const [items, setItems] = useState<UploadItem[]>([]);

  const update = (uid: string, change: Partial<UploadItem>) =>
    setItems((all) => all.map((item) => (item.uid === uid ? { ...item, ...change } : item)));

  const onsetsFile = onsets[0]?.originFileObj ?? null;

  /** A file refused in the browser: listed with its reason, never sent. */
  const refuseBeforeSending = (
    file: { uid: string; name: string; size: number },
    rejection: NonNullable<UploadItem['rejection']>,
  ) =>
    setItems((all) => [
      {
        uid: file.uid,
        name: file.name,
        sizeBytes: file.size,
        kind,
        rejection,
        file: null,
        onsets: null,
        confirmKind: false,
        replaces: null,
        percent: 0,
        status: 'rejected',
      },
      ...all,
    ]);

  /** Sends (or sends again) one item as it now stands; the answer decides its next status. */
  const send = (item: UploadItem, controller = new AbortController()) => {
    if (item.file === null) return;
    update(item.uid, { ...item, status: 'uploading', percent: 0 });
    return upload(
      {
        visitId,
        kind: item.kind,
        file: item.file,
        onsets: item.kind === 'task' ? item.onsets : null,
        confirmKind: item.confirmKind,
        replaces: item.replaces,
      },
      { signal: controller.signal, onProgress: ({ percent }) => update(item.uid, { percent }) },
    ).then(
      (created) => update(item.uid, { status: 'accepted', percent: 100, recordingId: created.id }),
      (caught: unknown) => {
        const mismatch =
          caught instanceof ApiError && caught.code === KIND_UNCONFIRMED
            ? kindMismatchOf(caught.details)
            : null;
        const taken =
          caught instanceof ApiError && caught.code === KIND_TAKEN
            ? kindTakenOf(caught.details)
            : null;
        if (mismatch !== null && caught instanceof ApiError) {
          update(item.uid, { status: 'kind-unconfirmed', mismatch, message: caught.message });
        } else if (taken !== null && caught instanceof ApiError) {
          update(item.uid, { status: 'kind-taken', taken, message: caught.message });
        } else if (caught instanceof ApiError && caught.status === 422) {
          update(item.uid, {
            status: 'rejected',
            rejection: rejectionFromDetails(caught.details, caught.message),
            recordingId: rejectedRecordingId(caught.details),
          });
        } else {
          update(item.uid, {
            status: 'error',
            message: caught instanceof ApiError ? caught.message : 'The upload failed.',
          });
        }
        throw caught;
      },
    );
  };

  const beforeUpload: UploadProps['beforeUpload'] = (file) => {
    if (EDF_NAME.test(file.name)) return true;
    refuseBeforeSending(file, {
      message: `${file.name} is not an EDF, EDF+, BDF or BDF+ file, so it was not sent.`,
      field: 'file name',
      found: file.name.includes('.') ? `.${file.name.split('.').pop() ?? ''}` : 'no extension',
      expected: '.edf or .bdf',
    });
    return Upload.LIST_IGNORE;
  };

  const customRequest: UploadProps['customRequest'] = (options) => {
    const file = options.file;
    if (!(file instanceof File)) return;
    const uid =
      'uid' in file && typeof file.uid === 'string' ? file.uid : `${file.name}-${Date.now()}`;
    const csv = kind === 'task' ? onsetsFile : null;
    const controller = new AbortController();
    const item: UploadItem = {
      uid,
      name: file.name,
      sizeBytes: file.size,
      file,
      onsets: csv,
      kind,
      confirmKind: false,
      replaces: null,
      percent: 0,
      status: 'uploading',
    };
    setItems((all) => [item, ...all]);
    void send(item, controller)?.then(
      () => options.onSuccess?.(null),
      (caught: unknown) =>
        options.onError?.(caught instanceof Error ? caught : new Error(String(caught))),
    );
    // The onset CSV belongs to this one task recording.
    if (csv !== null) setOnsets([]);
    return { abort: () => controller.abort() };
  };

  return (
    <Card title={`Upload recordings for ${visitName}`}>
      <Form layout="vertical" component="div">
        <Flex gap={32} wrap align="flex-start">
          <Form.Item label="Kind of recording" className="gyre-below-sm">
            <Segmented<RecordingKind>
              value={kind}
              onChange={setKind}
              // Two long labels do not fit side by side on a phone.
              orientation={screens.sm === true ? 'horizontal' : 'vertical'}
              options={[
                { label: 'Resting (eyes closed)', value: 'resting' },
                { label: 'Task (with stimulus onsets)', value: 'task' },
              ]}
            />
          </Form.Item>
          {kind === 'task' && (
            <Form.Item
              label="Onset CSV (optional)"
              extra="Without a CSV, the onsets come from the file's EDF+ annotations."
              className="gyre-below-sm"
            >
              <Upload
                accept=".csv,text/csv"
                maxCount={1}
                fileList={onsets}
                beforeUpload={(file) => {
                  if (!CSV_NAME.test(file.name)) {
                    refuseBeforeSending(file, {
                      message: `${file.name} is not a CSV file, so it was not kept as the onset list.`,
                      field: 'onset file name',
                      found: file.name,
                      expected: 'a name ending in .csv',
                    });
                    return Upload.LIST_IGNORE;
                  }
                  return false;
                }}
                onChange={({ fileList }) => setOnsets(fileList.slice(-1))}
              >
                <Button>Choose onset CSV</Button>
              </Upload>
            </Form.Item>
          )}
        </Flex>
      </Form>
      <Upload.Dragger
        name="file"
        multiple
        accept=".edf,.EDF,.bdf,.BDF,.rec"
        showUploadList={false}
        beforeUpload={beforeUpload}
        customRequest={customRequest}
        aria-label={`Drop ${kind} EDF or BDF files here or press Enter to choose them`}
      >
        <div className="gyre-dropzone-prompt">
          <Typography.Title level={4} className="gyre-dropzone-title">
            Drop {kind === 'resting' ? 'resting' : 'task'} EDF, EDF+, BDF or BDF+ files here
          </Typography.Title>
          <Typography.Text type="secondary">
            or click to choose them. Each file is checked before Gyre keeps it; the patient field is
            blanked.
          </Typography.Text>
        </div>
      </Upload.Dragger>
      {items.length > 0 && (
        <ul aria-label="Uploads" className="gyre-bare-list gyre-above">
          {items.map((item) => (
            <UploadItemView
              key={item.uid}
              item={item}
              visitId={visitId}
              onResend={(next) => void send(next)?.catch(() => undefined)}
              onDismiss={() => update(item.uid, { status: 'dismissed' })}
              recording={recordings.find((r) => r.id === item.recordingId)}
              onClear={() => {
                setItems((all) => all.filter((other) => other.uid !== item.uid));
                if (item.recordingId !== undefined) onDismissRecording(item.recordingId);
              }}
            />
          ))}
        </ul>
      )}
    </Card>
  );
}
