import type { ReportView, ReportState } from '@gyre/shared';
import { subject } from '@gyre/shared';
import { App, Button, Card, Segmented, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { PageHeader } from '../../../components/page-header';
import { ResearchCaution } from '../../../components/research-caution';
import { ApiError } from '../../../lib/api-client';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { downloadReport } from '../api/download-report';
import { useReportContext } from '../api/report-context';
import { useReports } from '../api/reports';
import { PagedTable } from '../../../components/paged-table';
import { usePagedList } from '../../../components/use-paged-list';
import {
  stateFilterOptions,
  stateTagColumn,
  type StateLook,
} from '../../../components/table-columns';

const PAGE_SIZE = 20;

const STATE_LOOK: Record<ReportState, StateLook> = {
  draft: { label: 'Draft', color: 'default' },
  signed: { label: 'Signed', color: 'processing' },
  sent: { label: 'Sent', color: 'success' },
};

/** A report has a file once it is signed; a draft has none yet. */
export function hasFile(report: ReportView): boolean {
  return report.state === 'signed' || report.state === 'sent';
}

/** Reports (coordinator): the visit reports of their site, with download. */
export function ReportsPage() {
  const { me } = useSession();
  const ability = useAppAbility();
  const { message } = App.useApp();
  const list = usePagedList<ReportState | 'all'>(PAGE_SIZE, 'all');
  const state = list.filter;
  const reports = useReports(state === 'all' ? null : state, list.page, PAGE_SIZE);
  const context = useReportContext();
  const [downloading, setDownloading] = useState<string | null>(null);
  const seesDrafts = ability.can(
    'read',
    subject('Report', { state: 'draft', studyId: me.user.studyId, siteId: me.user.siteId }),
  );

  const download = async (report: ReportView, name: string) => {
    setDownloading(report.id);
    try {
      await downloadReport(report.id, `gyre-report-${name}.pdf`);
    } catch (caught) {
      message.error(
        caught instanceof ApiError ? caught.message : 'The report could not be downloaded.',
      );
    } finally {
      setDownloading(null);
    }
  };

  const columns: TableColumnsType<ReportView> = [
    {
      title: 'Participant',
      dataIndex: 'participantId',
      render: (id: string) =>
        context.participantCode(id) ?? <Typography.Text code>{id.slice(0, 8)}</Typography.Text>,
    },
    {
      title: 'Visit',
      dataIndex: 'visitId',
      render: (id: string) => {
        const visit = context.visit(id);
        return visit === null ? (
          <Typography.Text code>{id.slice(0, 8)}</Typography.Text>
        ) : (
          <>
            {visit.label}{' '}
            <Typography.Text type="secondary">· {formatDate(visit.visitDate)}</Typography.Text>
          </>
        );
      },
    },
    stateTagColumn(STATE_LOOK, 110),
    {
      title: 'Last change',
      dataIndex: 'updatedAt',
      width: 200,
      render: (at: string) => <span className="gyre-figures">{formatDateTime(at)}</span>,
    },
    {
      title: 'PDF',
      key: 'file',
      width: 150,
      render: (_, report) => {
        // No participant while the visit is blinded for the caller (blinded review).
        const who = report.participantId ?? '';
        const name = `${context.participantCode(who) ?? who.slice(0, 8)}-${context.visit(report.visitId)?.label ?? report.visitId.slice(0, 8)}`;
        return hasFile(report) ? (
          <Button
            size="small"
            onClick={() => void download(report, name)}
            loading={downloading === report.id}
            aria-label={`Download the report of ${name}`}
          >
            Download
          </Button>
        ) : (
          <Typography.Text type="secondary">Not signed yet</Typography.Text>
        );
      },
    },
  ];

  const options = stateFilterOptions(STATE_LOOK).filter(
    (option) => seesDrafts || option.value !== 'draft',
  );

  return (
    <>
      <ResearchCaution />
      <PageHeader
        title="Reports"
        description={
          <>
            {me.site !== null
              ? `Visit reports of ${me.site.name}, once an analyst has signed them.`
              : 'Visit reports of the study.'}{' '}
            <Link to={paths.reportRevisions}>Every signed revision</Link>
          </>
        }
        extra={
          <Segmented<ReportState | 'all'>
            value={state}
            onChange={list.setFilter}
            options={options}
            aria-label="Show reports in this state"
          />
        }
      />
      <Card>
        <PagedTable<ReportView>
          query={reports}
          loadErrorTitle="The reports could not be loaded"
          emptyText={
            state === 'all'
              ? 'No reports yet. A report appears here once an analyst signs a visit.'
              : `No ${state} reports.`
          }
          columns={columns}
          {...list.paging}
        />
      </Card>
    </>
  );
}
