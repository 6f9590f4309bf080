import { OVERVIEW_MEASURES, type StudyOverviewView } from '@gyre/shared';
import { Col, Empty, Row, Typography } from 'antd';
import { useMemo } from 'react';
import { LegendKey } from '../../../components/charts/legend-key';
import { PlotFigure } from '../../../components/charts/plot-figure';
import { MEASURE_WORDS, overviewSpec, splitEntries, type OverviewSplit } from './overview-spec';
import { GYRE_COLORS } from '../../../app/theme';

const CHART_HEIGHT_PX = 260;

/** PAF, CoG and Δf over the planned visits: group (or site) means with 95 % CI, participants faint. */
export function OverviewCharts({
  overview,
  split,
}: {
  overview: StudyOverviewView;
  split: OverviewSplit;
}) {
  const specs = useMemo(
    () =>
      OVERVIEW_MEASURES.map((m) => ({
        measure: m,
        spec: overviewSpec(overview, m, split, CHART_HEIGHT_PX),
      })),
    [overview, split],
  );
  const entries = splitEntries(overview, split);
  const hasValues = (measure: (typeof OVERVIEW_MEASURES)[number]): boolean =>
    overview.participants.some((p) => p.cells.some((cell) => cell[measure] !== null));
  return (
    <>
      <div className="gyre-chart-legend gyre-below-xs">
        {entries.map((e) => (
          <LegendKey key={e.key ?? 'none'} colour={e.colour} text={`${e.name}: mean and 95 % CI`} />
        ))}
        <LegendKey colour={GYRE_COLORS.ink} text="Each participant" stroke="faint" />
      </div>
      <Row gutter={[24, 24]}>
        {specs.map(({ measure, spec }) => (
          <Col xs={24} xl={8} key={measure}>
            <Typography.Title level={5} className="gyre-flush-top">
              {MEASURE_WORDS[measure].title}
            </Typography.Title>
            {hasValues(measure) ? (
              <PlotFigure
                label={`${MEASURE_WORDS[measure].title} by ${split}`}
                spec={spec}
                heightPx={CHART_HEIGHT_PX}
                caption={`Each ${split === 'group' ? 'group' : 'site'}'s mean ${MEASURE_WORDS[measure].axis} per planned visit with its 95 % confidence interval (Student t; none from a single value), over every participant's course drawn faint.`}
              />
            ) : (
              <Empty
                image={Empty.PRESENTED_IMAGE_SIMPLE}
                description="No values yet on a planned visit."
              />
            )}
          </Col>
        ))}
      </Row>
    </>
  );
}
