import type { RecordingKind, RecordingRejection } from '@gyre/shared';
import { Button, Card, Flex, Form, Progress, Segmented, Typography, Upload } from 'antd';
import type { UploadFile, UploadProps } from 'antd';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { formatBytes } from '../../../lib/format';
import { useUploadRecording } from '../api/upload-recording';
import { RejectionText, rejectionFromDetails } from './rejection-text';

interface UploadItem {
  uid: string;
  name: string;
  sizeBytes: number;
  kind: RecordingKind;
  percent: number;
  status: 'uploading' | 'accepted' | 'rejected' | 'error';
  rejection?: RecordingRejection;
  message?: string;
}

const EDF_NAME = /\.(edf|rec)$/i;
const CSV_NAME = /\.csv$/i;

/** Drop one or more EDF/EDF+ files (and, for a task, an onset CSV); each shows its progress. */
export function RecordingDropzone({ visitId, visitName }: { visitId: string; visitName: string }) {
  const upload = useUploadRecording();
  const [kind, setKind] = useState<RecordingKind>('resting');
  const [onsets, setOnsets] = useState<UploadFile[]>([]);
  const [items, setItems] = useState<UploadItem[]>([]);

  const update = (uid: string, change: Partial<UploadItem>) =>
    setItems((all) => all.map((item) => (item.uid === uid ? { ...item, ...change } : item)));

  const onsetsFile = onsets[0]?.originFileObj ?? null;

  const beforeUpload: UploadProps['beforeUpload'] = (file) => {
    if (EDF_NAME.test(file.name)) return true;
    setItems((all) => [
      {
        uid: file.uid,
        name: file.name,
        sizeBytes: file.size,
        kind,
        percent: 0,
        status: 'rejected',
        rejection: {
          message: `${file.name} is not an EDF or EDF+ file, so it was not sent.`,
          field: 'file name',
          found: file.name.includes('.') ? `.${file.name.split('.').pop() ?? ''}` : 'no extension',
          expected: '.edf',
        },
      },
      ...all,
    ]);
    return Upload.LIST_IGNORE;
  };

  const customRequest: UploadProps['customRequest'] = (options) => {
    const file = options.file;
    if (!(file instanceof File)) return;
    const uid =
      'uid' in file && typeof file.uid === 'string' ? file.uid : `${file.name}-${Date.now()}`;
    const csv = kind === 'task' ? onsetsFile : null;
    const controller = new AbortController();
    setItems((all) => [
      { uid, name: file.name, sizeBytes: file.size, kind, percent: 0, status: 'uploading' },
      ...all,
    ]);
    upload(
      { visitId, kind, file, onsets: csv },
      {
        signal: controller.signal,
        onProgress: ({ percent }) => update(uid, { percent }),
      },
    ).then(
      (recording) => {
        update(uid, { status: 'accepted', percent: 100 });
        options.onSuccess?.(recording);
      },
      (caught: unknown) => {
        if (caught instanceof ApiError && caught.status === 422) {
          update(uid, {
            status: 'rejected',
            rejection: rejectionFromDetails(caught.details, caught.message),
          });
        } else {
          update(uid, {
            status: 'error',
            message: caught instanceof ApiError ? caught.message : 'The upload failed.',
          });
        }
        options.onError?.(caught instanceof Error ? caught : new Error(String(caught)));
      },
    );
    // The onset CSV belongs to this one task recording.
    if (csv !== null) setOnsets([]);
    return { abort: () => controller.abort() };
  };

  return (
    <Card title={`Upload recordings for ${visitName}`}>
      <Form layout="vertical" component="div">
        <Flex gap={32} wrap align="flex-start">
          <Form.Item label="Kind of recording" style={{ marginBottom: 12 }}>
            <Segmented<RecordingKind>
              value={kind}
              onChange={setKind}
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
              style={{ marginBottom: 12 }}
            >
              <Upload
                accept=".csv,text/csv"
                maxCount={1}
                fileList={onsets}
                beforeUpload={(file) => {
                  if (!CSV_NAME.test(file.name)) {
                    setItems((all) => [
                      {
                        uid: file.uid,
                        name: file.name,
                        sizeBytes: file.size,
                        kind,
                        percent: 0,
                        status: 'rejected',
                        rejection: {
                          message: `${file.name} is not a CSV file, so it was not kept as the onset list.`,
                          field: 'onset file name',
                          found: file.name,
                          expected: 'a name ending in .csv',
                        },
                      },
                      ...all,
                    ]);
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
        accept=".edf,.EDF,.rec"
        showUploadList={false}
        beforeUpload={beforeUpload}
        customRequest={customRequest}
        aria-label={`Drop ${kind} EDF files here or press Enter to choose them`}
      >
        <div style={{ padding: '12px 0' }}>
          <Typography.Title level={4} style={{ margin: 0, color: '#24525A' }}>
            Drop {kind === 'resting' ? 'resting' : 'task'} EDF or EDF+ files here
          </Typography.Title>
          <Typography.Text type="secondary">
            or click to choose them. Each file is checked before Gyre keeps it; the patient field is
            blanked.
          </Typography.Text>
        </div>
      </Upload.Dragger>
      {items.length > 0 && (
        <ul aria-label="Uploads" style={{ listStyle: 'none', padding: 0, margin: '16px 0 0' }}>
          {items.map((item) => (
            <li
              key={item.uid}
              style={{ padding: '10px 0', borderBottom: '1px solid #DCE5E6' }}
              data-upload-status={item.status}
            >
              <Flex justify="space-between" gap={16}>
                <Typography.Text strong>{item.name}</Typography.Text>
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
              {item.status === 'accepted' && (
                <Typography.Text type="success">
                  Received and checked; the computation is queued.
                </Typography.Text>
              )}
              {item.status === 'rejected' && item.rejection !== undefined && (
                <div role="alert">
                  <Typography.Text type="danger" strong>
                    Not accepted.{' '}
                  </Typography.Text>
                  <RejectionText rejection={item.rejection} />
                </div>
              )}
              {item.status === 'error' && (
                <Typography.Text type="danger" role="alert">
                  {item.message}
                </Typography.Text>
              )}
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
