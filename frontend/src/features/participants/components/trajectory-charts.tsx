import type { TrajectoryView, TrendView } from '@gyre/shared';
import { Col, Row, Typography } from 'antd';
import { useCallback, type ComponentProps, type ReactNode } from 'react';
import { GYRE_COLORS } from '../../../app/theme';
import { LegendKey } from '../../../components/charts/legend-key';
import { PlotFigure } from '../../../components/charts/plot-figure';
import { formatSlopeHzPerYear } from '../../../lib/format';
import { alphaFrequencySpec, onsetChangeSpec, SERIES_COLOUR } from './trajectory-spec';

const CHART_HEIGHT_PX = 280;

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * A trend in words: the slope when the study's rule allows one, else why there is none
 * (too few visits with a value, or too short a span), with the actual count or span.
 */
export function trendText(trend: TrendView, rule: TrajectoryView['trendRule']): string {
  if (trend.slopeHzPerYear !== null) {
    return `${formatSlopeHzPerYear(trend.slopeHzPerYear)} over ${plural(trend.visits, 'visit', 'visits')} (${plural(trend.spanDays, 'day', 'days')})`;
  }
  if (trend.reason === 'too-few-visits') {
    return `no trend: ${plural(trend.visits, 'visit', 'visits')} with a value, the study needs ${rule.minVisits}`;
  }
  return `no trend: the span is too short (${plural(trend.spanDays, 'day', 'days')}, the study needs ${rule.minSpanDays})`;
}

/** Two panels: resting PAF and CoG, and the task's onset Δf, across the visit dates. */
export function TrajectoryCharts({ trajectory }: { trajectory: TrajectoryView }) {
  const alpha = useCallback(
    (widthPx: number) => alphaFrequencySpec(trajectory, { widthPx, heightPx: CHART_HEIGHT_PX }),
    [trajectory],
  );
  const onset = useCallback(
    (widthPx: number) => onsetChangeSpec(trajectory, { widthPx, heightPx: CHART_HEIGHT_PX }),
    [trajectory],
  );
  const { trends, trendRule } = trajectory;
  const anyFlagged = trajectory.visits.some((v) => v.flagged);
  const flaggedKey = anyFlagged && (
    <LegendKey colour={GYRE_COLORS.amber} text="Flagged visit" stroke="dashed" />
  );
  return (
    <Row gutter={[24, 24]}>
      <TrajectoryPanel
        title="Individual alpha frequency at rest"
        label="Alpha frequency trajectory"
        spec={alpha}
        caption={`Peak alpha frequency and centre of gravity of each visit's resting recording. A robust (Theil–Sen) trend line is drawn only from ${trendRule.minVisits} visits spanning at least ${trendRule.minSpanDays} days (the study's rule).`}
      >
        <LegendKey colour={SERIES_COLOUR.PAF} text={`PAF (${trendText(trends.paf, trendRule)})`} />
        <LegendKey colour={SERIES_COLOUR.CoG} text={`CoG (${trendText(trends.cog, trendRule)})`} />
        {(trends.paf.slopeHzPerYear !== null || trends.cog.slopeHzPerYear !== null) && (
          <LegendKey colour="rgba(29,43,47,0.6)" text="Theil–Sen trend" stroke="dashed" />
        )}
        {flaggedKey}
      </TrajectoryPanel>
      <TrajectoryPanel
        title="Onset slowing in the task"
        label="Onset change trajectory"
        spec={onset}
        caption="Change of the mean instantaneous frequency after onset (post − baseline) at each visit; below zero means the rhythm slowed."
      >
        <LegendKey
          colour={SERIES_COLOUR.Δf}
          text={`ROI Δf (${trendText(trends.deltaF, trendRule)})`}
        />
        {flaggedKey}
      </TrajectoryPanel>
    </Row>
  );
}

/** One half of the trajectory charts: its title, legend keys (the children), and the plot. */
function TrajectoryPanel({
  title,
  label,
  spec,
  caption,
  children,
}: {
  title: string;
  label: string;
  spec: ComponentProps<typeof PlotFigure>['spec'];
  caption: string;
  children: ReactNode;
}) {
  return (
    <Col xs={24} xl={12}>
      <Typography.Title level={5} className="gyre-flush-top">
        {title}
      </Typography.Title>
      <div className="gyre-chart-legend gyre-figures">{children}</div>
      <PlotFigure label={label} spec={spec} heightPx={CHART_HEIGHT_PX} caption={caption} />
    </Col>
  );
}
