import type { BulkRowStatus, BulkUploadReport, BulkUploadRowReport } from '@gyre/shared';
import { BULK_MANIFEST_COLUMNS } from '@gyre/shared';
import { Alert, Button, Card, Flex, Table, Tag, Typography, Upload } from 'antd';
import type { TableColumnsType, UploadFile } from 'antd';
import { useState } from 'react';
import { reportOfError, useBulkUpload } from '../api/bulk-upload';
import { useCheckedImport } from '../hooks/use-checked-import';
import { ImportActions } from './import-actions';
import { ProblemLines } from './problem-lines';
import { formatCount } from '../../../lib/format';

const MANIFEST_NAME = 'manifest.csv';

const STATUS_TAG: Record<BulkRowStatus, { color: string; text: string }> = {
  ok: { color: 'green', text: 'ready' },
  warning: { color: 'gold', text: 'warning' },
  error: { color: 'red', text: 'error' },
};

const COLUMNS: TableColumnsType<BulkUploadRowReport> = [
  { title: 'Row', dataIndex: 'row', width: 56 },
  { title: 'Participant', dataIndex: 'participantCode' },
  { title: 'Planned visit', dataIndex: 'plannedVisit' },
  { title: 'Kind', dataIndex: 'kind' },
  {
    title: 'File',
    dataIndex: 'file',
    render: (_: string, row) =>
      row.onsetsFile === null ? row.file : `${row.file} + ${row.onsetsFile}`,
  },
  {
    title: 'Status',
    dataIndex: 'status',
    render: (status: BulkRowStatus) => (
      <Tag color={STATUS_TAG[status].color}>{STATUS_TAG[status].text}</Tag>
    ),
  },
  {
    title: 'Message',
    key: 'message',
    render: (_: unknown, row) => (
      <ProblemLines
        errors={row.errors}
        warnings={row.warnings}
        fallback={row.visit === 'new' ? 'creates the visit' : 'adds to the existing visit'}
      />
    ),
  },
];

/** What a report is about: the manifest and the files, by name and size. */
function selectionOf(manifest: File | null, files: File[]): string {
  return [manifest?.name ?? '', ...files.map((f) => `${f.name}:${f.size}`)].join('|');
}

const fileOf = (item: UploadFile | undefined): File | null =>
  (item?.originFileObj as File | undefined) ?? null;

/**
 * Bulk upload (technician): drop many recordings with their CSV manifest (picked, or the
 * `manifest.csv` among the dropped files), check every row without importing, then import all
 * of them at once. The server imports every row or none; this panel only shows its report.
 */
export function BulkUploadPanel({ studyId }: { studyId: string }) {
  const send = useBulkUpload();
  const [dropped, setDropped] = useState<UploadFile[]>([]);
  const [picked, setPicked] = useState<UploadFile[]>([]);

  const detected = dropped.find((f) => f.name.toLowerCase() === MANIFEST_NAME);
  const manifest = fileOf(picked[0]) ?? fileOf(detected);
  const files = dropped
    // A dropped manifest.csv is never sent as a recording, even beside a picked manifest.
    .filter((f) => f !== detected)
    .map(fileOf)
    .filter((f): f is File => f !== null);
  // A change of the selection asks for a new check before importing.
  const checked = useCheckedImport({
    selection: selectionOf(manifest, files),
    refusedOf: reportOfError,
    onImported: () => {
      setDropped([]);
      setPicked([]);
    },
  });
  const { current } = checked;
  const clean =
    current !== null &&
    current.dryRun &&
    current.summary.errors === 0 &&
    current.strayFiles.length === 0;

  const start = (dryRun: boolean) => {
    if (manifest === null) return;
    void checked.run(dryRun, (options) => send({ studyId, manifest, files, dryRun }, options));
  };

  return (
    <Card title="Bulk upload">
      <Flex vertical gap={12}>
        <Typography.Paragraph type="secondary" className="gyre-flush">
          Many recordings at once, described by a CSV manifest with the columns{' '}
          {BULK_MANIFEST_COLUMNS.join(', ')} (see the user guide). Check first: every row is
          reported on its own, and the import takes every row or none.
        </Typography.Paragraph>
        <Upload.Dragger
          multiple
          accept=".edf,.bdf,.rec,.csv"
          fileList={dropped}
          beforeUpload={() => false}
          onChange={({ fileList }) => setDropped(fileList)}
          aria-label="Recordings, onset CSVs and manifest"
        >
          <p>Drop the recordings, their onset CSVs and manifest.csv here, or click to choose</p>
        </Upload.Dragger>
        <Flex wrap gap={8} align="center">
          <Upload
            accept=".csv"
            maxCount={1}
            fileList={picked}
            beforeUpload={() => false}
            onChange={({ fileList }) => setPicked(fileList.slice(-1))}
          >
            <Button>Choose the manifest</Button>
          </Upload>
          <Typography.Text type={manifest === null ? 'secondary' : undefined}>
            {manifest === null
              ? 'No manifest yet: choose one or drop a file named manifest.csv'
              : `Manifest: ${manifest.name}, ${formatCount(files.length, 'file')}`}
          </Typography.Text>
        </Flex>
        <ImportActions
          checkLabel="Check (dry run)"
          importLabel="Import"
          canCheck={manifest !== null}
          canImport={clean}
          state={checked}
          onRun={start}
        />
        {current !== null && <BulkReportSummary report={current} />}
      </Flex>
    </Card>
  );
}

function BulkReportSummary({ report }: { report: BulkUploadReport }) {
  const { summary } = report;
  const counts = `${formatCount(summary.rows, 'row')}: ${summary.ok} ready, ${summary.warnings} with a warning, ${summary.errors} with an error; ${formatCount(summary.newVisits, 'new visit')}.`;
  const failed = summary.errors > 0 || report.strayFiles.length > 0;
  return (
    <Flex vertical gap={8}>
      <Alert
        type={report.imported ? 'success' : failed ? 'error' : 'info'}
        showIcon
        title={
          report.imported
            ? `Imported: ${summary.rows} recordings queued. ${counts}`
            : failed
              ? `Nothing was imported. ${counts} Correct the rows (or the files) and check again.`
              : `Checked, nothing imported yet. ${counts} Import when ready.`
        }
      />
      {report.strayFiles.length > 0 && (
        <Alert
          type="error"
          showIcon
          title="Files the manifest does not name"
          description={
            <ul className="gyre-compact-list">
              {report.strayFiles.map((stray) => (
                <li key={stray.file}>{stray.message}</li>
              ))}
            </ul>
          }
        />
      )}
      <Table<BulkUploadRowReport>
        aria-label="Manifest rows"
        size="small"
        rowKey="row"
        columns={COLUMNS}
        dataSource={report.rows}
        pagination={false}
        scroll={{ x: 760 }}
      />
    </Flex>
  );
}
