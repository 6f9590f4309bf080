import type { BidsImportFilePreview, BidsImportPreview } from '@gyre/shared';
import { formatNumber } from '@gyre/shared';
import { Alert, Button, Card, Checkbox, Flex, Input, Table, Tag, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { useRef, useState } from 'react';
import { pathOf, previewOfError, useBidsImport, type BidsSource } from '../api/bids-import';
import { useCheckedImport } from '../hooks/use-checked-import';
import { ImportActions } from './import-actions';
import { KIND_LABELS } from './kind-labels';
import { ProblemLines } from './problem-lines';
import { formatCount } from '../../../lib/format';

const NBSP = '\u00a0';

const COLUMNS: TableColumnsType<BidsImportFilePreview> = [
  { title: 'File', dataIndex: 'path', render: (path: string) => path.split('/').at(-1) },
  {
    title: 'Participant',
    key: 'participant',
    render: (_: unknown, f) =>
      f.participantCode === null ? (
        `sub-${f.subject}`
      ) : (
        <Flex gap={4} wrap>
          {f.participantCode}
          {f.participant === 'new' && <Tag>new</Tag>}
        </Flex>
      ),
  },
  {
    title: 'Visit',
    key: 'visit',
    render: (_: unknown, f) =>
      f.plannedVisit === null ? (
        f.session === null ? (
          '—'
        ) : (
          `ses-${f.session}`
        )
      ) : (
        <Flex gap={4} wrap>
          {f.plannedVisit}
          {f.visitDate !== null && ` (${f.visitDate})`}
          {f.visit === 'new' && <Tag>new</Tag>}
        </Flex>
      ),
  },
  { title: 'Kind', dataIndex: 'kind', render: (kind: 'resting' | 'task') => KIND_LABELS[kind] },
  {
    title: 'Onsets',
    key: 'onsets',
    render: (_: unknown, f) =>
      f.onsetCount === null
        ? '—'
        : `${formatNumber(f.onsetCount, 0)}${f.conditions.length > 0 ? ` (${f.conditions.join(', ')})` : ''}`,
  },
  {
    title: 'Channels left out',
    key: 'channels',
    render: (_: unknown, f) =>
      f.channelsLeftOut.length === 0
        ? 'none'
        : f.channelsLeftOut
            .map((c) => (c.reason === null ? c.label : `${c.label}: ${c.reason}`))
            .join('; '),
  },
  {
    title: 'Line noise',
    key: 'line',
    render: (_: unknown, f) =>
      f.lineFrequencyHz === null
        ? '50 and 60 Hz'
        : `${formatNumber(f.lineFrequencyHz, 0)}${NBSP}Hz`,
  },
  {
    title: 'Problems',
    key: 'problems',
    render: (_: unknown, f) => (
      <ProblemLines errors={f.problems} warnings={f.warnings} fallback="none" />
    ),
  },
];

/** What a preview is about: the files (path and size) and the choices sent with them. */
function selectionOf(source: BidsSource | null, create: boolean, visitDate: string): string {
  if (source === null) return '';
  const files = source.kind === 'zip' ? [source.file] : source.files;
  return [create, visitDate, ...files.map((f) => `${pathOf(f)}:${f.size}`)].join('|');
}

/**
 * EEG-BIDS import (technician): a BIDS session folder or its zip. The server maps every
 * recording to a participant and planned visit and checks it (dry run); the preview is shown
 * for confirmation, and Import stores every file or none.
 */
export function BidsImportPanel({ studyId }: { studyId: string }) {
  const send = useBidsImport();
  const folderInput = useRef<HTMLInputElement>(null);
  const zipInput = useRef<HTMLInputElement>(null);
  const [source, setSource] = useState<BidsSource | null>(null);
  const [createParticipants, setCreateParticipants] = useState(false);
  const [visitDate, setVisitDate] = useState('');

  const checked = useCheckedImport({
    selection: selectionOf(source, createParticipants, visitDate),
    refusedOf: previewOfError,
    onImported: () => setSource(null),
  });
  const { current } = checked;
  const confirmable =
    current !== null &&
    current.dryRun &&
    current.summary.withProblems === 0 &&
    current.problems.length === 0;

  const start = (dryRun: boolean) => {
    if (source === null) return;
    void checked.run(dryRun, (options) =>
      send({ studyId, source, createParticipants, visitDate, dryRun }, options),
    );
  };

  const described =
    source === null
      ? 'Nothing chosen yet'
      : source.kind === 'zip'
        ? `Zip: ${source.file.name}`
        : `Folder: ${formatCount(source.files.length, 'file')}`;

  return (
    <Card title="EEG-BIDS import">
      <Flex vertical gap={12}>
        <Typography.Paragraph type="secondary" className="gyre-flush">
          A BIDS session folder (sub-…/ses-…/eeg/ with *_eeg.edf or *_eeg.bdf, *_events.tsv,
          *_channels.tsv, *_eeg.json) or its zip. Subjects become participant codes, sessions
          planned visits. Check first: nothing is stored until you confirm, and the import takes
          every file or none.
        </Typography.Paragraph>
        <input
          ref={(element) => {
            folderInput.current = element;
            // Not in React's attribute types: the browser's folder picker.
            element?.setAttribute('webkitdirectory', '');
          }}
          type="file"
          multiple
          hidden
          aria-label="BIDS folder"
          onChange={(event) => {
            const files = [...(event.target.files ?? [])];
            setSource(files.length === 0 ? null : { kind: 'folder', files });
            event.target.value = '';
          }}
        />
        <input
          ref={zipInput}
          type="file"
          accept=".zip"
          hidden
          aria-label="BIDS zip"
          onChange={(event) => {
            const file = event.target.files?.[0];
            setSource(file === undefined ? null : { kind: 'zip', file });
            event.target.value = '';
          }}
        />
        <Flex wrap gap={8} align="center">
          <Button onClick={() => folderInput.current?.click()}>Choose a folder</Button>
          <Button onClick={() => zipInput.current?.click()}>Choose a zip</Button>
          <Typography.Text type={source === null ? 'secondary' : undefined}>
            {described}
          </Typography.Text>
        </Flex>
        <Flex wrap gap={16} align="center">
          <Checkbox
            checked={createParticipants}
            onChange={(event) => setCreateParticipants(event.target.checked)}
          >
            Add unknown subjects as new participants of my site
          </Checkbox>
          <label>
            <Typography.Text>Visit date when the folder has no scans.tsv </Typography.Text>
            <Input
              type="date"
              value={visitDate}
              onChange={(event) => setVisitDate(event.target.value)}
              style={{ width: 170 }}
              aria-label="Visit date for new visits"
            />
          </label>
        </Flex>
        <ImportActions
          checkLabel="Check (preview)"
          importLabel="Confirm import"
          canCheck={source !== null}
          canImport={confirmable}
          state={checked}
          onRun={start}
        />
        {current !== null && <PreviewView preview={current} />}
      </Flex>
    </Card>
  );
}

function PreviewView({ preview }: { preview: BidsImportPreview }) {
  const { summary } = preview;
  const counts = `${formatCount(summary.files, 'recording')}, ${formatNumber(summary.withProblems, 0)} with a problem; ${formatCount(summary.newParticipants, 'new participant')}, ${formatCount(summary.newVisits, 'new visit')}.`;
  const failed = summary.withProblems > 0 || preview.problems.length > 0;
  return (
    <Flex vertical gap={8}>
      <Alert
        type={preview.imported ? 'success' : failed ? 'error' : 'info'}
        showIcon
        title={
          preview.imported
            ? `Imported: ${counts}`
            : failed
              ? `Nothing was imported. ${counts} Correct the folder and check again.`
              : `Checked, nothing stored yet. ${counts} Confirm to import.`
        }
        description={
          preview.problems.length > 0 ? (
            <ul className="gyre-compact-list">
              {preview.problems.map((text) => (
                <li key={text}>{text}</li>
              ))}
            </ul>
          ) : undefined
        }
      />
      <Table<BidsImportFilePreview>
        aria-label="BIDS recordings"
        size="small"
        rowKey="path"
        columns={COLUMNS}
        dataSource={preview.files}
        pagination={false}
        scroll={{ x: 960 }}
      />
    </Flex>
  );
}
