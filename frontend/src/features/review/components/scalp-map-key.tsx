import {
  type ScalpColourScale,
  type ScalpMapModel,
  SCALP_DIVERGING_STOPS,
  SCALP_MEASURE_NAMES,
  SCALP_SEQUENTIAL_STOPS,
  type ScalpMarkLine,
  scalpMarkLines,
} from '@gyre/shared';
import { Flex, Typography } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { omissionWords } from '../../../lib/roi-usage';

/** The colour bar under the map: the scale's gradient, its ticks in Hz and its title. */
export function ScalpColourBar({
  scale,
  measure,
}: {
  scale: ScalpColourScale;
  measure: ScalpMapModel['measure'];
}) {
  const stops = scale.diverging ? SCALP_DIVERGING_STOPS : SCALP_SEQUENTIAL_STOPS;
  const gradient = stops
    .map((colour, i) => `${colour} ${Math.round((i / (stops.length - 1)) * 100)}%`)
    .join(', ');
  const [low, high] = scale.domainHz;
  const title = `${SCALP_MEASURE_NAMES[measure]}, Hz`;
  return (
    <figure className="gyre-scalp-scale" aria-label={`Colour scale: ${title}`}>
      <div
        aria-hidden="true"
        style={{
          height: 12,
          borderRadius: 2,
          border: `1px solid ${GYRE_COLORS.line}`,
          background: `linear-gradient(to right, ${gradient})`,
        }}
      />
      <div className="gyre-scalp-scale-ticks gyre-figures">
        {scale.ticks.map((tick) => {
          const at = ((tick.value - low) / (high - low)) * 100;
          return (
            <span
              key={tick.value}
              data-testid="scalp-colour-tick"
              style={{
                position: 'absolute',
                left: `${at}%`,
                transform: `translateX(${at <= 0 ? '0' : at >= 100 ? '-100%' : '-50%'})`,
                fontSize: 12,
                whiteSpace: 'nowrap',
              }}
            >
              {tick.label}
            </span>
          );
        })}
      </div>
      <figcaption className="gyre-caption">{title}</figcaption>
    </figure>
  );
}

function Symbol({ mark }: { mark: ScalpMarkLine['mark'] }) {
  const arm = 3.5;
  return (
    <svg aria-hidden="true" width={14} height={14} viewBox="-7 -7 14 14" className="gyre-no-shrink">
      {mark === 'no-value' && (
        <circle r={5.5} fill={GYRE_COLORS.line} stroke={GYRE_COLORS.inkMuted} />
      )}
      {mark === 'missing' && (
        <circle r={5.5} fill="none" stroke={GYRE_COLORS.inkMuted} strokeDasharray="3 2" />
      )}
      {mark === 'left-out' && (
        <>
          <circle r={5.5} fill={GYRE_COLORS.paper} stroke={GYRE_COLORS.ink} />
          <path
            d={`M${-arm} ${-arm}L${arm} ${arm}M${-arm} ${arm}L${arm} ${-arm}`}
            stroke={GYRE_COLORS.ink}
          />
        </>
      )}
    </svg>
  );
}

/** Which channels are drawn without a colour, and why, named. */
export function ScalpMarksKey({ map }: { map: ScalpMapModel }) {
  const { lines, unplaced } = scalpMarkLines(map, omissionWords);
  if (lines.length === 0 && unplaced === null) return null;
  return (
    <Flex vertical gap={4} className="gyre-review-small" data-testid="scalp-marks">
      {lines.map((line) => (
        <Flex key={line.mark} gap={6} align="center" wrap={false}>
          <Symbol mark={line.mark} />
          <span className="gyre-wrap-anywhere">{line.text}</span>
        </Flex>
      ))}
      {unplaced !== null && (
        <Typography.Text type="secondary" className="gyre-wrap-anywhere">
          {unplaced}
        </Typography.Text>
      )}
    </Flex>
  );
}
