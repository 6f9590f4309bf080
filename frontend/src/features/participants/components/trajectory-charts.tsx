import type { TrajectoryDto } from '@gyre/shared';
import { Col, Row, Typography } from 'antd';
import { useMemo } from 'react';
import { GYRE_COLORS } from '../../../app/theme';
import { PlotFigure } from '../../../components/charts/plot-figure';
import { alphaFrequencySpec, onsetChangeSpec, SERIES_COLOUR } from './trajectory-spec';

function slopeText(slope: number | null): string {
  return slope === null ? '—' : `${slope > 0 ? '+' : ''}${slope.toFixed(2)} Hz/year`;
}

function Key({ colour, text, dashed = false }: { colour: string; text: string; dashed?: boolean }) {
  return (
    <span style={{ marginRight: 16, whiteSpace: 'nowrap' }}>
      <span
        aria-hidden="true"
        style={{
          display: 'inline-block',
          width: 18,
          borderTop: `${dashed ? '2px dashed' : '3px solid'} ${colour}`,
          verticalAlign: 'middle',
          marginRight: 6,
        }}
      />
      {text}
    </span>
  );
}

/** Two panels: resting PAF and CoG, and the task's onset Δf, across the visit dates. */
export function TrajectoryCharts({ trajectory }: { trajectory: TrajectoryDto }) {
  const alpha = useMemo(() => alphaFrequencySpec(trajectory), [trajectory]);
  const onset = useMemo(() => onsetChangeSpec(trajectory), [trajectory]);
  const { slopesHzPerYear } = trajectory;
  const anyFlagged = trajectory.visits.some((v) => v.flagged);
  return (
    <Row gutter={[24, 24]}>
      <Col xs={24} xl={12}>
        <Typography.Title level={5} style={{ marginTop: 0 }}>
          Individual alpha frequency at rest
        </Typography.Title>
        <div style={{ fontSize: 13, marginBottom: 6 }} className="gyre-figures">
          <Key colour={SERIES_COLOUR.PAF} text={`PAF (trend ${slopeText(slopesHzPerYear.paf)})`} />
          <Key colour={SERIES_COLOUR.CoG} text={`CoG (trend ${slopeText(slopesHzPerYear.cog)})`} />
          <Key colour="rgba(29,43,47,0.6)" text="Theil–Sen trend" dashed />
          {anyFlagged && <Key colour={GYRE_COLORS.amber} text="Flagged visit" dashed />}
        </div>
        <PlotFigure
          label="Alpha frequency trajectory"
          spec={alpha}
          heightPx={280}
          caption="Peak alpha frequency and centre of gravity of each visit's resting recording, with robust (Theil–Sen) trend lines."
        />
      </Col>
      <Col xs={24} xl={12}>
        <Typography.Title level={5} style={{ marginTop: 0 }}>
          Onset slowing in the task
        </Typography.Title>
        <div style={{ fontSize: 13, marginBottom: 6 }} className="gyre-figures">
          <Key
            colour={SERIES_COLOUR.Δf}
            text={`ROI Δf (trend ${slopeText(slopesHzPerYear.deltaF)})`}
          />
          {anyFlagged && <Key colour={GYRE_COLORS.amber} text="Flagged visit" dashed />}
        </div>
        <PlotFigure
          label="Onset change trajectory"
          spec={onset}
          heightPx={280}
          caption="Change of the mean instantaneous frequency after onset (post − baseline) at each visit; below zero means the rhythm slowed."
        />
      </Col>
    </Row>
  );
}
