import { type AnalysisRunView, type CycleEstimateView, UNIT_SPACE } from '@gyre/shared';
import { Alert, Card, Descriptions, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { formatNumber, formatShareAsPercent } from '../../../lib/format';
import { DeltaFWithCi, FiguresTable } from './delta-f-cell';

interface EstimateRow {
  key: string;
  name: string;
  trials: string;
  deltaFHz: number | null;
  ciHz: [number, number] | null;
}

const ESTIMATE_COLUMNS: TableColumnsType<EstimateRow> = [
  { title: 'Estimate', key: 'name', dataIndex: 'name' },
  { title: 'Trials used', key: 'trials', dataIndex: 'trials', align: 'right' },
  {
    title: 'Δf, 95 % CI',
    key: 'deltaF',
    align: 'right',
    render: (_, row) => <DeltaFWithCi deltaFHz={row.deltaFHz} ciHz={row.ciHz} />,
  },
];

/**
 * Hz to two decimals, or three when the threshold needs them (0.005 Hz), so a difference and
 * the threshold it is compared with never print as the same rounded number.
 */
export function formatHzLike(valueHz: number | null, thresholdHz: number): string {
  const hundredths = thresholdHz * 100;
  const decimals = Math.abs(hundredths - Math.round(hundredths)) < 1e-9 ? 2 : 3;
  return valueHz === null
    ? formatNumber(null, decimals)
    : `${formatNumber(valueHz, decimals)}${UNIT_SPACE}Hz`;
}

/**
 * The warning when the two estimates differ by more than the threshold of the settings the
 * run was computed with (the one its `disagrees` was judged against).
 */
export function disagreementText(cycles: CycleEstimateView, runThresholdHz: number): string {
  return `The cycle-by-cycle and the phase-based Δf differ by ${formatHzLike(cycles.disagreementHz, runThresholdHz)}, more than this run's threshold of ${formatHzLike(runThresholdHz, runThresholdHz)}. The rhythm may not be sinusoidal enough for the phase-based estimate; look at the raster before relying on it.`;
}

/**
 * Which threshold judged the run, and the study's current one when that differs (a re-run
 * would judge against it). `studyThresholdHz` is null while the study's settings are unknown.
 */
export function thresholdWords(runThresholdHz: number, studyThresholdHz: number | null): string {
  const used = `${formatHzLike(runThresholdHz, runThresholdHz)}, from the settings this run was computed with`;
  if (studyThresholdHz === null || studyThresholdHz === runThresholdHz) return used;
  return `${used}; the study's settings now say ${formatHzLike(studyThresholdHz, studyThresholdHz)} (a re-run would use that)`;
}

/**
 * The cycle-by-cycle cross-check beside the phase-based region-of-interest Δf: both estimates
 * side by side, and a warning when they disagree by more than the run's own
 * `cycleDisagreementHz`. `studyThresholdHz` is the study's current one, named when it differs.
 */
export function CycleEstimate({
  run,
  cycles,
  studyThresholdHz,
}: {
  run: AnalysisRunView;
  cycles: CycleEstimateView | null;
  studyThresholdHz: number | null;
}) {
  if (cycles === null) return null;
  const runThresholdHz = run.depthSettings.cycleDisagreementHz;
  const estimates: EstimateRow[] = [
    {
      key: 'phase',
      name: 'Phase-based',
      trials: run.trialsKept === null ? '—' : `${run.trialsKept} of ${run.trialsTotal ?? '—'}`,
      deltaFHz: run.roiDeltaFHz,
      ciHz: run.roiCiHz,
    },
    {
      key: 'cycles',
      name: 'Cycle-by-cycle',
      trials: `${cycles.trialsUsed} of ${cycles.trialsTotal}`,
      deltaFHz: cycles.deltaFHz,
      ciHz: cycles.ciHz,
    },
  ];
  return (
    <Card
      type="inner"
      size="small"
      title="Cross-check: cycle-by-cycle Δf"
      aria-label="Cycle-by-cycle cross-check"
      className="gyre-above-sm gyre-below"
    >
      {cycles.disagrees && (
        <Alert
          type="warning"
          showIcon
          role="alert"
          title="The two estimates disagree"
          description={disagreementText(cycles, runThresholdHz)}
          className="gyre-below-sm"
        />
      )}
      <FiguresTable<EstimateRow>
        aria-label="Δf by both estimates"
        rowKey="key"
        columns={ESTIMATE_COLUMNS}
        dataSource={estimates}
      />
      <Typography.Paragraph
        type="secondary"
        className="gyre-review-small gyre-above-xs gyre-below-sm"
      >
        Cycle-by-cycle trials are those with burst cycles in both the baseline and the post window.
      </Typography.Paragraph>
      <Descriptions
        size="small"
        bordered
        column={1}
        className="gyre-figures"
        items={[
          {
            key: 'difference',
            label: 'Difference between the estimates',
            children: formatHzLike(cycles.disagreementHz, runThresholdHz),
          },
          {
            key: 'threshold',
            label: 'Disagreement warning above',
            children: thresholdWords(runThresholdHz, studyThresholdHz),
          },
          {
            key: 'burst',
            label: 'Cycles in bursts',
            children: formatShareAsPercent(cycles.burstCycleShare),
          },
        ]}
      />
    </Card>
  );
}
