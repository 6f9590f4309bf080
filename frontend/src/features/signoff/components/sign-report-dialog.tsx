import type { ReportRevisionView, ReportSignOffView } from '@gyre/shared';
import { Alert, Button, Checkbox, Flex, Form, Input, Modal, Spin, Typography } from 'antd';
import { useEffect, useId, useMemo, useState } from 'react';
import useSWR from 'swr';
import { RESEARCH_CAUTION } from '../../../components/research-caution';
import { ApiError } from '../../../lib/api-client';
import { fetchReportPreview, reportPreviewPath } from '../api/preview-report';
import { useSignReport } from '../api/sign-report';
import { GYRE_COLORS } from '../../../app/theme';

interface SignFormValues {
  password: string;
  confirmed: boolean;
}

/**
 * The draft PDF as an object URL, fetched once per mount and again after `version` changes;
 * the URL is revoked when it is replaced or the dialog goes away.
 */
function usePreview(visitId: string, version: number) {
  const mountId = useId();
  const { data: blob, error } = useSWR<Blob, Error>(
    `${reportPreviewPath(visitId)}#${mountId}-${version}`,
    () => fetchReportPreview(visitId),
    { revalidateOnFocus: false, revalidateOnReconnect: false, shouldRetryOnError: false },
  );
  const url = useMemo(() => (blob === undefined ? null : URL.createObjectURL(blob)), [blob]);
  useEffect(
    () => () => {
      if (url !== null) URL.revokeObjectURL(url);
    },
    [url],
  );
  return { url, error: error ?? null };
}

/**
 * Preview and sign: the draft PDF as it will be signed, the meaning of the signature to
 * confirm, and the password entered again (21 CFR Part 11 §11.50, §11.200). The server checks
 * everything again and refuses if the visit changed since this preview. Mount it to open it.
 */
export function SignReportDialog({
  visitId,
  signOff,
  canSign,
  onClose,
  onSigned,
  onStale,
}: {
  visitId: string;
  signOff: ReportSignOffView;
  /** False: a preview only (e.g. for a monitor), without the signing form. */
  canSign: boolean;
  onClose: () => void;
  onSigned: (revision: ReportRevisionView) => void;
  /** The server said the visit changed: reload the sign-off state. */
  onStale: () => Promise<unknown>;
}) {
  const [form] = Form.useForm<SignFormValues>();
  const [version, setVersion] = useState(0);
  const preview = usePreview(visitId, version);
  const [submitting, setSubmitting] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const sign = useSignReport(visitId);

  const submit = async ({ password }: SignFormValues) => {
    if (signOff.draftFingerprint === null) return;
    setSubmitting(true);
    setFailure(null);
    try {
      const revision = await sign({
        password,
        meaning: signOff.meaning,
        fingerprint: signOff.draftFingerprint,
      });
      onSigned(revision);
    } catch (error) {
      if (error instanceof ApiError && error.code === 'SIGNOFF_WRONG_PASSWORD') {
        form.setFields([{ name: 'password', errors: ['This is not your password.'], value: '' }]);
      } else if (error instanceof ApiError && error.code === 'SIGNOFF_CONTENT_CHANGED') {
        setFailure(
          'The visit changed since this preview (new results or a flag). The preview has been reloaded: review it, then sign.',
        );
        await onStale();
        setVersion((v) => v + 1);
      } else {
        setFailure(error instanceof Error ? error.message : 'The report could not be signed.');
      }
    } finally {
      setSubmitting(false);
    }
  };

  const revision = signOff.pendingRevision;
  return (
    <Modal
      open
      onCancel={onClose}
      width={920}
      destroyOnHidden
      title={
        canSign && revision !== null
          ? `Preview and sign revision ${revision}`
          : 'Preview of the draft report'
      }
      footer={null}
    >
      <Alert type="warning" showIcon title={RESEARCH_CAUTION} className="gyre-below-sm" />
      <div
        style={{
          height: '58vh',
          border: `1px solid ${GYRE_COLORS.line}`,
          borderRadius: 6,
          overflow: 'hidden',
          marginBottom: 16,
        }}
      >
        {preview.error !== null ? (
          <Alert
            type="error"
            showIcon
            title="The preview could not be made"
            description={preview.error.message}
            style={{ margin: 16 }}
          />
        ) : preview.url === null ? (
          <Flex align="center" justify="center" style={{ height: '100%' }}>
            <Spin description="Making the draft PDF" />
          </Flex>
        ) : (
          <iframe
            title="Draft report preview"
            src={preview.url}
            style={{ width: '100%', height: '100%', border: 0 }}
          />
        )}
      </div>
      {preview.url !== null && (
        <Typography.Paragraph type="secondary">
          No preview above?{' '}
          <a href={preview.url} download="gyre-report-draft.pdf">
            Download the draft PDF
          </a>{' '}
          and open it with any PDF reader.
        </Typography.Paragraph>
      )}
      {canSign && revision !== null && (
        <Form<SignFormValues>
          form={form}
          layout="vertical"
          onFinish={(values) => void submit(values)}
          requiredMark={false}
          aria-label="Sign the report"
        >
          <Typography.Paragraph>
            Your signature, name, date and time will be printed on the report with its meaning:{' '}
            <Typography.Text strong>{signOff.meaning}</Typography.Text>. A signed revision never
            changes; later results or flag changes make a new revision.
          </Typography.Paragraph>
          <Form.Item
            name="confirmed"
            valuePropName="checked"
            rules={[
              {
                validator: (_, checked: boolean | undefined) =>
                  checked === true
                    ? Promise.resolve()
                    : Promise.reject(new Error('Confirm the meaning of your signature.')),
              },
            ]}
          >
            <Checkbox>I confirm: {signOff.meaning}.</Checkbox>
          </Form.Item>
          <Form.Item
            name="password"
            label="Your password, entered again"
            rules={[{ required: true, message: 'Enter your password to sign.' }]}
          >
            <Input.Password autoComplete="current-password" style={{ maxWidth: 360 }} />
          </Form.Item>
          {failure !== null && (
            <Alert type="error" showIcon title={failure} className="gyre-below-sm" />
          )}
          <Flex gap={8} justify="end">
            <Button onClick={onClose}>Cancel</Button>
            <Button
              type="primary"
              htmlType="submit"
              loading={submitting}
              disabled={preview.url === null}
            >
              Sign revision {revision}
            </Button>
          </Flex>
        </Form>
      )}
    </Modal>
  );
}
