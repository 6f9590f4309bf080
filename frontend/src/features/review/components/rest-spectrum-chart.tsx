import type { RestResultsView } from '@gyre/shared';
import { Flex, Typography } from 'antd';
import { useCallback, useMemo } from 'react';
import { PlotFigure } from '../../../components/charts/plot-figure';
import { formatHz, formatHzRange, formatQuantity } from '../../../lib/format';
import { COG_COLOUR, PAF_COLOUR, restSpectrumSpec, spectrumPoints } from './rest-spectrum-spec';

function DashKey({ colour }: { colour: string }) {
  return (
    <span
      aria-hidden="true"
      className="gyre-legend-swatch"
      style={{ borderTop: `2px dashed ${colour}` }}
    />
  );
}

const CHART_HEIGHT_PX = 280;

/** The resting power spectrum with the individual alpha frequency marked two ways. */
export function RestSpectrumChart({ rest, roiLabel }: { rest: RestResultsView; roiLabel: string }) {
  const points = useMemo(
    () => spectrumPoints(rest.frequencyHz, rest.powerUv2PerHz),
    [rest.frequencyHz, rest.powerUv2PerHz],
  );
  const spec = useCallback(
    (widthPx: number) =>
      restSpectrumSpec({
        points,
        alphaWindowHz: rest.alphaWindowHz,
        pafHz: rest.pafHz,
        cogHz: rest.cogHz,
        widthPx,
        heightPx: CHART_HEIGHT_PX,
      }),
    [points, rest.alphaWindowHz, rest.pafHz, rest.cogHz],
  );
  return (
    <div>
      <Flex gap={24} wrap className="gyre-below-xs gyre-figures">
        <span data-testid="rest-paf">
          <DashKey colour={PAF_COLOUR} />
          PAF{' '}
          {rest.pafHz === null ? (
            <Typography.Text type="warning">no clear peak</Typography.Text>
          ) : (
            formatHz(rest.pafHz)
          )}
        </span>
        <span data-testid="rest-cog">
          <DashKey colour={COG_COLOUR} />
          CoG {formatHz(rest.cogHz)}
        </span>
        {rest.prominenceDb !== null && (
          <span>Peak prominence {formatQuantity(rest.prominenceDb, 'decibel')}</span>
        )}
        <Typography.Text type="secondary">
          Alpha window {formatHzRange(rest.alphaWindowHz)} · {roiLabel}
        </Typography.Text>
      </Flex>
      {points.length === 0 ? (
        <Typography.Text type="secondary">No spectrum to draw.</Typography.Text>
      ) : (
        <PlotFigure
          label="Rest spectrum"
          spec={spec}
          heightPx={CHART_HEIGHT_PX}
          caption={
            rest.pafHz === null
              ? 'Welch power spectrum of the resting recording. No clear alpha peak stands out of the background, so no PAF is given.'
              : 'Welch power spectrum of the resting recording; the dashed lines mark the peak alpha frequency (PAF) and the alpha centre of gravity (CoG).'
          }
        />
      )}
    </div>
  );
}
