import { Alert, Descriptions, Table, Tag } from 'antd';
import type { CalibrationCheckView, CalibrationRunView } from '@gyre/shared';
import { formatDateTime } from '../../../lib/format';
import { checkTolerance, checkValue, CHECK_LABELS, STATE_WORDS } from './calibration-words';

const STATE_COLOURS = {
  queued: 'default',
  computing: 'processing',
  passed: 'success',
  failed: 'error',
} as const;

export function CalibrationStateTag({ run }: { run: CalibrationRunView }) {
  return <Tag color={STATE_COLOURS[run.state]}>{STATE_WORDS[run.state]}</Tag>;
}

/** One run: each value expected vs computed with its tolerance, then versions, date and who. */
export function CalibrationResult({ run }: { run: CalibrationRunView }) {
  const finished = run.state === 'passed' || run.state === 'failed';
  return (
    <>
      {run.state === 'failed' && (
        <Alert
          type="error"
          showIcon
          className="gyre-below-sm"
          title={`The calibration of site ${run.siteCode} failed`}
          description={
            run.error ??
            'At least one computed value lies outside its tolerance. Results computed at this site may not be right until a calibration passes again.'
          }
        />
      )}
      {finished && run.checks.length > 0 && (
        <Table<CalibrationCheckView>
          size="small"
          rowKey="key"
          pagination={false}
          aria-label={`Calibration values of site ${run.siteCode}`}
          dataSource={run.checks}
          scroll={{ x: 'max-content' }}
          columns={[
            {
              title: 'Value',
              dataIndex: 'key',
              render: (key: CalibrationCheckView['key']) => CHECK_LABELS[key],
            },
            { title: 'Expected', render: (_, c) => checkValue(c, c.expected) },
            { title: 'Computed', render: (_, c) => checkValue(c, c.computed) },
            { title: 'Tolerance', render: (_, c) => checkTolerance(c) },
            {
              title: 'Result',
              render: (_, c) =>
                c.passed ? <Tag color="success">within</Tag> : <Tag color="error">outside</Tag>,
            },
          ]}
        />
      )}
      <Descriptions
        size="small"
        column={{ xs: 1, md: 2 }}
        className="gyre-above-sm"
        items={[
          {
            key: 'by',
            label: 'Run by',
            children: run.requestedByName ?? 'someone outside your access',
          },
          { key: 'at', label: 'Started', children: formatDateTime(run.requestedAt) },
          { key: 'done', label: 'Finished', children: formatDateTime(run.finishedAt) },
          { key: 'code', label: 'Gyre version', children: run.gyreVersion },
          {
            key: 'settings',
            label: 'Analysis settings',
            children: `version ${run.settingsVersion}`,
          },
          { key: 'signal', label: 'Signal', children: run.signalName },
        ]}
      />
    </>
  );
}
