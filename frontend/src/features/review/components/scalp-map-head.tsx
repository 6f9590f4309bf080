import {
  type PlacedLabel,
  placeLabels,
  SCALP_OUTER_RADIUS,
  SCALP_RING_RADIUS,
  type ScalpMapChannel,
  type ScalpMapModel,
  scalpColourOf,
} from '@gyre/shared';
import type { KeyboardEvent } from 'react';
import { GYRE_COLORS } from '../../../app/theme';
import { omissionWords } from '../../../lib/roi-usage';
import { formatDeltaHz, formatHz } from '../../../lib/format';

/** SVG units per unit of the map's disc (the Fpz–T7–Oz–T8 ring has radius 1). */
const UNIT = 100;
/** Room for the 9/10 columns, Nz and Iz (the outer radius) with their dots. */
const VIEW_HALF = (SCALP_OUTER_RADIUS + 0.13) * UNIT;
const DOT = 7;
/** The channel names under the dots, in SVG units (13 px at the map's widest, 10 px on a phone). */
const LABEL_SIZE = 9;

/** What a channel reads as on hover, focus and in the table. */
export function channelReading(map: ScalpMapModel, channel: ScalpMapChannel): string {
  if (channel.mark === 'missing') return 'not in the file';
  const value =
    channel.valueHz === null
      ? 'no value'
      : map.measure === 'deltaF'
        ? formatDeltaHz(channel.valueHz)
        : formatHz(channel.valueHz);
  return channel.omission === null
    ? value
    : `left out: ${omissionWords(channel.omission)}${channel.valueHz === null ? '' : ` (${value})`}`;
}

/** A dot's look by its mark: coloured, grey, hollow with a cross, or dashed and hollow. */
function ChannelDot({
  map,
  channel,
  picked,
  onPick,
}: {
  map: ScalpMapModel;
  channel: ScalpMapChannel;
  picked: boolean;
  onPick: () => void;
}) {
  const cx = channel.point[0] * UNIT;
  const cy = 0 - channel.point[1] * UNIT; // not −0 at y = 0
  const ring = picked ? 2.4 : 1;
  let shape: React.ReactNode;
  if (channel.mark === 'value' && map.scale !== null && channel.valueHz !== null) {
    shape = (
      <circle
        r={DOT}
        fill={scalpColourOf(channel.valueHz, map.scale)}
        stroke={GYRE_COLORS.ink}
        strokeWidth={ring}
      />
    );
  } else if (channel.mark === 'no-value') {
    shape = (
      <circle r={DOT} fill={GYRE_COLORS.line} stroke={GYRE_COLORS.inkMuted} strokeWidth={ring} />
    );
  } else if (channel.mark === 'missing') {
    shape = (
      <circle
        r={DOT}
        fill="none"
        stroke={GYRE_COLORS.inkMuted}
        strokeWidth={ring}
        strokeDasharray="3 2"
      />
    );
  } else {
    const arm = DOT * 0.7;
    shape = (
      <>
        <circle r={DOT} fill={GYRE_COLORS.paper} stroke={GYRE_COLORS.ink} strokeWidth={ring} />
        <path
          d={`M${-arm} ${-arm}L${arm} ${arm}M${-arm} ${arm}L${arm} ${-arm}`}
          stroke={GYRE_COLORS.ink}
          strokeWidth={1.2}
        />
      </>
    );
  }
  return (
    <g
      transform={`translate(${cx} ${cy})`}
      data-channel={channel.name}
      data-mark={channel.mark}
      onMouseEnter={onPick}
      style={{ cursor: 'default' }}
    >
      <title>{`${channel.name}: ${channelReading(map, channel)}`}</title>
      {shape}
    </g>
  );
}

/** A channel's name beside its dot, where `placeLabels` put it. */
function ChannelName({ channel, label }: { channel: ScalpMapChannel; label: PlacedLabel }) {
  return (
    <g transform={`translate(${channel.point[0] * UNIT} ${0 - channel.point[1] * UNIT})`}>
      <text
        x={label.dx}
        y={label.dy}
        textAnchor={label.anchor}
        fontSize={LABEL_SIZE}
        fill={GYRE_COLORS.ink}
        // A halo in the page colour keeps a name legible where it touches a neighbour's dot.
        stroke={GYRE_COLORS.paper}
        strokeWidth={2.5}
        paintOrder="stroke"
        style={{ pointerEvents: 'none' }}
      >
        {channel.name}
      </text>
    </g>
  );
}

/**
 * The head seen from above (nose up, left on the left) with a dot per channel. The picture
 * is one image to assistive technology (its label sums it up; the table beside it lists
 * every value); pointer hover and the arrow keys pick a channel for the reading below it.
 */
export function ScalpMapHead({
  map,
  label,
  picked,
  onPick,
}: {
  map: ScalpMapModel;
  label: string;
  picked: string | null;
  onPick: (name: string | null) => void;
}) {
  const names = map.channels.map((c) => c.name);
  const step = (by: number) => {
    if (names.length === 0) return;
    const at = picked === null ? -1 : names.indexOf(picked);
    onPick(names[(at + by + names.length) % names.length]);
  };
  const onKeyDown = (event: KeyboardEvent) => {
    if (event.key === 'ArrowRight' || event.key === 'ArrowDown') step(1);
    else if (event.key === 'ArrowLeft' || event.key === 'ArrowUp') step(-1);
    else if (event.key === 'Escape') onPick(null);
    else return;
    event.preventDefault();
  };
  const head = SCALP_RING_RADIUS * UNIT;
  const labels = placeLabels(
    map.channels.map((c) => ({
      name: c.name,
      centre: [c.point[0] * UNIT, -c.point[1] * UNIT] as const,
    })),
    DOT,
    LABEL_SIZE,
    [-1, 1].map((side) => ({
      x0: side * 1.04 * head - 0.045 * head,
      y0: -0.16 * head,
      x1: side * 1.04 * head + 0.045 * head,
      y1: 0.16 * head,
    })),
  );
  return (
    <svg
      role="img"
      aria-label={label}
      tabIndex={0}
      viewBox={`${-VIEW_HALF} ${-VIEW_HALF} ${2 * VIEW_HALF} ${2 * VIEW_HALF + LABEL_SIZE + 2}`}
      style={{ width: '100%', maxWidth: 400, height: 'auto', display: 'block' }}
      onKeyDown={onKeyDown}
      onFocus={() => {
        if (picked === null) step(1);
      }}
      onMouseLeave={() => onPick(null)}
    >
      <g fill="none" stroke={GYRE_COLORS.inkSoft} strokeWidth={1.5}>
        <circle r={head} fill={GYRE_COLORS.mist} />
        <path
          d={`M${-0.1 * head} ${-0.995 * head}L0 ${-1.12 * head}L${0.1 * head} ${-0.995 * head}`}
        />
        <ellipse cx={-1.04 * head} cy={0} rx={0.045 * head} ry={0.16 * head} />
        <ellipse cx={1.04 * head} cy={0} rx={0.045 * head} ry={0.16 * head} />
      </g>
      {map.channels.map((channel) => (
        <ChannelDot
          key={channel.name}
          map={map}
          channel={channel}
          picked={channel.name === picked}
          onPick={() => onPick(channel.name)}
        />
      ))}
      {/* The names over every dot, so a later dot never hides an earlier name. */}
      {map.channels.map((channel, index) => (
        <ChannelName key={channel.name} channel={channel} label={labels[index]} />
      ))}
    </svg>
  );
}
