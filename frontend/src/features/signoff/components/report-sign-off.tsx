import type { ReportRevisionView } from '@gyre/shared';
import { App, Button, Flex, List, Skeleton, Tag, Typography } from 'antd';
import { useEffect, useState } from 'react';
import { ReadError } from '../../../components/page-states';
import { formatDateTime } from '../../../lib/format';
import { useAppAbility } from '../../../lib/session/ability';
import { useSignOff } from '../api/get-sign-off';
import { reportStatusOf } from './report-status';

export { ReportStatusTag } from './report-status';
import { SignReportDialog } from './sign-report-dialog';
import { StateTag } from '../../../components/table-columns';
import { REVISION_STATE_LOOK } from './revision-state-look';
import { useRevisionDownload } from './use-revision-download';

/** One signed revision with its signature and a download. */
function RevisionItem({ revision }: { revision: ReportRevisionView }) {
  const { busy, download } = useRevisionDownload();
  return (
    <List.Item
      actions={[
        <Button
          key="download"
          size="small"
          loading={busy === revision.id}
          onClick={() => void download(revision)}
          aria-label={`Download revision ${revision.revision}`}
        >
          Download
        </Button>,
      ]}
    >
      <List.Item.Meta
        title={
          <span>
            Revision {revision.revision} <StateTag look={REVISION_STATE_LOOK[revision.state]} />
          </span>
        }
        description={
          <span className="gyre-figures">
            {revision.signerName}, {formatDateTime(revision.signedAt)}: {revision.meaning}
          </span>
        }
      />
    </List.Item>
  );
}

/**
 * The Review screen's report panel: the report's state, the draft preview, signing (for
 * analysts) and every signed revision with its PDF. `watch` is anything whose change means
 * the report may have changed (e.g. the visit's flag), so the panel reloads.
 */
export function ReportSignOff({ visitId, watch }: { visitId: string; watch?: unknown }) {
  const ability = useAppAbility();
  const { message } = App.useApp();
  const signOff = useSignOff(visitId);
  const { data, error, mutate } = signOff;
  const [dialog, setDialog] = useState<'closed' | 'preview' | 'sign'>('closed');

  useEffect(() => {
    if (watch !== undefined) void mutate();
  }, [watch, mutate]);

  if (error !== undefined) {
    return <ReadError read={signOff} title="The report could not be loaded" />;
  }
  if (data === undefined) return <Skeleton active paragraph={{ rows: 2 }} />;
  if (data === null) return <span>No report has been drafted for this visit yet.</span>;

  // The report is in the user's scope (the server answered it): the type-level rule decides.
  const maySign = ability.can('sign', 'Report');
  // The same words as Review's header chip (reportStatusOf): one state, one wording.
  const status = reportStatusOf(data);
  const open = async (mode: 'preview' | 'sign') => {
    await mutate();
    setDialog(mode);
  };

  return (
    <Flex vertical gap={12}>
      <div>
        <Tag color={status.color} className="gyre-wrapping" data-testid="report-state-card">
          {status.words}
        </Tag>
        {data.pendingRevision === null && data.cannotSignReason !== null && (
          <Typography.Paragraph type="secondary" className="gyre-flush gyre-above-xs">
            {data.cannotSignReason}
          </Typography.Paragraph>
        )}
      </div>
      <Flex gap={8} wrap>
        <Button disabled={data.draftFingerprint === null} onClick={() => void open('preview')}>
          Preview draft
        </Button>
        {maySign && (
          <Button
            type="primary"
            disabled={!data.canSign}
            onClick={() => void open('sign')}
            title={data.cannotSignReason ?? undefined}
          >
            {data.pendingRevision === null
              ? 'Sign report'
              : `Preview and sign revision ${data.pendingRevision}`}
          </Button>
        )}
      </Flex>
      {data.revisions.length > 0 && (
        <List
          size="small"
          header={<Typography.Text type="secondary">Signed revisions</Typography.Text>}
          dataSource={data.revisions}
          renderItem={(revision) => <RevisionItem revision={revision} />}
        />
      )}
      {dialog !== 'closed' && (
        <SignReportDialog
          visitId={visitId}
          signOff={data}
          canSign={dialog === 'sign' && maySign && data.canSign}
          onClose={() => setDialog('closed')}
          onStale={() => mutate()}
          onSigned={(revision) => {
            setDialog('closed');
            message.success(
              `Signed: revision ${revision.revision}. The site's coordinators are told by e-mail.`,
            );
          }}
        />
      )}
    </Flex>
  );
}
