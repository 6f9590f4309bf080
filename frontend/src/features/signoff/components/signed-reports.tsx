import type { ReportRevisionView } from '@gyre/shared';
import { Alert, Button, Card, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { useSearchParams } from 'react-router-dom';
import { ApiError } from '../../../lib/api-client';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useReportRevision, useReportRevisions } from '../api/report-revisions';
import { PagedTable } from '../../../components/paged-table';
import { usePagedList } from '../../../components/use-paged-list';
import { stateTagColumn } from '../../../components/table-columns';
import { REVISION_STATE_LOOK } from './revision-state-look';
import { useRevisionDownload } from './use-revision-download';

const PAGE_SIZE = 20;

const nameOf = (r: ReportRevisionView) =>
  `${r.participantCode} ${r.visitLabel} revision ${r.revision}`;

/** The revision an e-mail linked to (`/reports?revision=…`), with its download up front. */
function LinkedRevision({ revisionId }: { revisionId: string }) {
  const { data, error } = useReportRevision(revisionId);
  const { busy, download } = useRevisionDownload();
  if (error !== undefined) {
    return (
      <Alert
        type="error"
        showIcon
        className="gyre-below"
        title="The report of this link is not available to you"
        description={error instanceof ApiError ? error.message : undefined}
      />
    );
  }
  if (data === undefined) return null;
  return (
    <Card role="region" className="gyre-below" aria-label="The report you were sent">
      <Typography.Text strong>
        {data.participantCode}, {data.visitLabel} ({formatDate(data.visitDate)}), revision{' '}
        {data.revision}
      </Typography.Text>{' '}
      <Typography.Text type="secondary" className="gyre-figures">
        signed by {data.signerName}, {formatDateTime(data.signedAt)}
      </Typography.Text>{' '}
      <Button
        type="primary"
        size="small"
        loading={busy === data.id}
        onClick={() => void download(data)}
        aria-label={`Download PDF: ${nameOf(data)}`}
      >
        Download PDF
      </Button>
    </Card>
  );
}

/**
 * Reports for those who see signed reports only (coordinators): every signed revision of
 * their site, newest first, each downloadable; earlier revisions stay listed after a new one.
 */
export function SignedReports() {
  const [params] = useSearchParams();
  const linked = params.get('revision');
  const list = usePagedList(PAGE_SIZE);
  const revisions = useReportRevisions(list.page, PAGE_SIZE);
  const { busy, download } = useRevisionDownload();

  const columns: TableColumnsType<ReportRevisionView> = [
    { title: 'Participant', dataIndex: 'participantCode' },
    {
      title: 'Visit',
      key: 'visit',
      render: (_, r) => (
        <>
          {r.visitLabel}{' '}
          <Typography.Text type="secondary">· {formatDate(r.visitDate)}</Typography.Text>
        </>
      ),
    },
    { title: 'Revision', dataIndex: 'revision', width: 90, className: 'gyre-figures' },
    {
      title: 'Signed',
      key: 'signed',
      render: (_, r) => (
        <span className="gyre-figures">
          {r.signerName}, {formatDateTime(r.signedAt)}
        </span>
      ),
    },
    stateTagColumn(REVISION_STATE_LOOK, 90),
    {
      title: 'File',
      key: 'file',
      width: 140,
      render: (_, r) => (
        <Button
          size="small"
          loading={busy === r.id}
          onClick={() => void download(r)}
          aria-label={`Download PDF: ${nameOf(r)}`}
        >
          Download PDF
        </Button>
      ),
    },
  ];

  return (
    <>
      {linked !== null && <LinkedRevision revisionId={linked} />}
      <Card>
        <PagedTable<ReportRevisionView>
          query={revisions}
          loadErrorTitle="The signed reports could not be loaded"
          emptyText="No signed reports yet. A report appears here once an analyst signs a visit."
          columns={columns}
          {...list.paging}
          rowClassName={(r) => (r.id === linked ? 'ant-table-row-selected' : '')}
        />
      </Card>
    </>
  );
}
