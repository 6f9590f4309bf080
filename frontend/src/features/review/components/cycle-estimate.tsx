import type { AnalysisRunView, CycleEstimateView } from '@gyre/shared';
import { Alert, Card, Descriptions } from 'antd';
import {
  formatDeltaHz,
  formatDeltaHzRange,
  formatHz,
  formatShareAsPercent,
} from '../../../lib/format';

/** The warning when the two estimates differ by more than the study's threshold. */
export function disagreementText(cycles: CycleEstimateView, thresholdHz: number | null): string {
  const threshold =
    thresholdHz === null
      ? "the study's threshold"
      : `the study's threshold of ${formatHz(thresholdHz)}`;
  return `The cycle-by-cycle and the phase-based Δf differ by ${formatHz(cycles.disagreementHz)}, more than ${threshold}. The rhythm may not be sinusoidal enough for the phase-based estimate; look at the raster before relying on it.`;
}

/**
 * The cycle-by-cycle cross-check beside the phase-based region-of-interest Δf: both estimates
 * side by side, and a warning when they disagree. `thresholdHz` is the study's
 * `cycleDisagreementHz` (null while unknown).
 */
export function CycleEstimate({
  run,
  cycles,
  thresholdHz,
}: {
  run: AnalysisRunView;
  cycles: CycleEstimateView | null;
  thresholdHz: number | null;
}) {
  if (cycles === null) return null;
  return (
    <Card
      type="inner"
      size="small"
      title="Cross-check: cycle-by-cycle Δf"
      aria-label="Cycle-by-cycle cross-check"
      style={{ margin: '12px 0 16px' }}
    >
      {cycles.disagrees && (
        <Alert
          type="warning"
          showIcon
          role="alert"
          title="The two estimates disagree"
          description={disagreementText(cycles, thresholdHz)}
          style={{ marginBottom: 12 }}
        />
      )}
      <Descriptions
        size="small"
        bordered
        column={1}
        className="gyre-figures"
        items={[
          {
            key: 'both',
            label: 'Δf: phase-based | cycle-by-cycle',
            children: (
              <span data-testid="delta-f-both">
                {formatDeltaHz(run.roiDeltaFHz)} | {formatDeltaHz(cycles.deltaFHz)}
              </span>
            ),
          },
          {
            key: 'ci',
            label: '95 % CI: phase-based | cycle-by-cycle',
            children: `${formatDeltaHzRange(run.roiCiHz)} | ${formatDeltaHzRange(cycles.ciHz)}`,
          },
          {
            key: 'difference',
            label: 'Difference between the estimates',
            children: formatHz(cycles.disagreementHz),
          },
          {
            key: 'trials',
            label: 'Trials with burst cycles in both windows',
            children: `${cycles.trialsUsed} of ${cycles.trialsTotal}`,
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
