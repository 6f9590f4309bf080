import {
  type RecordingResultsView,
  type RecordingView,
  type ScalpMapMeasure,
  type ScalpMapModel,
  SCALP_MEASURE_NAMES,
  scalpMapOf,
} from '@gyre/shared';
import { Flex, Segmented, Typography } from 'antd';
import { type CSSProperties, useMemo, useState } from 'react';
import { EmptyState } from '../../../components/page-states';
import { ScalpMapHead, channelReading } from './scalp-map-head';
import { ScalpColourBar, ScalpMarksKey } from './scalp-map-key';
import { useShownResults } from './shown-results';

const SHORT_NAMES: Record<ScalpMapMeasure, string> = { paf: 'PAF', cog: 'CoG', deltaF: 'Δf' };

/** Read by screen readers, not drawn (the usual clip pattern, common practice). */
const VISUALLY_HIDDEN: CSSProperties = {
  position: 'absolute',
  width: 1,
  height: 1,
  padding: 0,
  margin: -1,
  overflow: 'hidden',
  clip: 'rect(0, 0, 0, 0)',
  whiteSpace: 'nowrap',
  border: 0,
};

/** The map in one sentence, for the picture's accessible name. */
function mapSummary(map: ScalpMapModel): string {
  const name = SCALP_MEASURE_NAMES[map.measure];
  const coloured = map.channels.filter((c) => c.mark === 'value').length;
  const others = map.channels.length - coloured;
  return (
    `Scalp map of ${name}: ${coloured} channels coloured by value` +
    (others > 0 ? `, ${others} drawn without a value (named below the map)` : '') +
    '. Every value is in the table that follows.'
  );
}

function ScalpMapTable({ map }: { map: ScalpMapModel }) {
  return (
    <table style={VISUALLY_HIDDEN}>
      <caption>{`${SCALP_MEASURE_NAMES[map.measure]} per channel`}</caption>
      <thead>
        <tr>
          <th scope="col">Channel</th>
          <th scope="col">File label</th>
          <th scope="col">Value</th>
        </tr>
      </thead>
      <tbody>
        {map.channels.map((channel) => (
          <tr key={channel.name}>
            <th scope="row">{channel.name}</th>
            <td>{channel.label}</td>
            <td>{channelReading(map, channel)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/**
 * Scalp maps of the visit's per-channel numbers: resting PAF and CoG, task Δf, one at a time.
 * Each comes from the results Review already shows (`results` of the recording's latest run).
 */
export function ScalpMapPanel({
  rest,
  task,
}: {
  rest: RecordingResultsView | undefined;
  task: RecordingResultsView | undefined;
}) {
  const maps = useMemo(() => {
    const out: ScalpMapModel[] = [];
    for (const [results, measures] of [
      [rest, ['paf', 'cog']],
      [task, ['deltaF']],
    ] as const) {
      if (results === undefined) continue;
      const source = {
        channels: results.channels,
        roiUsage: results.run.roiUsage,
        quality: results.quality,
      };
      for (const measure of measures) out.push(scalpMapOf(source, measure));
    }
    return out;
  }, [rest, task]);
  const [chosen, setChosen] = useState<ScalpMapMeasure | null>(null);
  const [picked, setPicked] = useState<string | null>(null);
  const map = maps.find((m) => m.measure === chosen) ?? maps[0];
  if (map === undefined) {
    return <EmptyState description="No computed results to map yet." />;
  }
  const pickedChannel = map.channels.find((c) => c.name === picked) ?? null;
  return (
    <Flex vertical gap={12} className="gyre-scalp-maps">
      {maps.length > 1 && (
        <Segmented<ScalpMapMeasure>
          aria-label="Value on the map"
          style={{ alignSelf: 'flex-start' }}
          value={map.measure}
          onChange={(measure) => {
            setChosen(measure);
            setPicked(null);
          }}
          options={maps.map((m) => ({ value: m.measure, label: SHORT_NAMES[m.measure] }))}
        />
      )}
      <Typography.Text strong>{SCALP_MEASURE_NAMES[map.measure]}</Typography.Text>
      {map.channels.length === 0 ? (
        <EmptyState description="No channel of this recording has a 10-10 position." />
      ) : (
        <>
          <ScalpMapHead map={map} label={mapSummary(map)} picked={picked} onPick={setPicked} />
          <div aria-live="polite" className="gyre-figures" style={{ minHeight: 22 }}>
            {pickedChannel === null ? (
              <Typography.Text type="secondary">
                Point at a channel, or focus the map and use the arrow keys.
              </Typography.Text>
            ) : (
              <span data-testid="scalp-reading">
                {`${pickedChannel.name}: ${channelReading(map, pickedChannel)}`}
              </span>
            )}
          </div>
          {map.scale === null ? (
            <Typography.Text type="secondary">
              No channel has a value for this measure, so there is no colour scale.
            </Typography.Text>
          ) : (
            <ScalpColourBar scale={map.scale} measure={map.measure} />
          )}
          <ScalpMarksKey map={map} />
          <ScalpMapTable map={map} />
        </>
      )}
    </Flex>
  );
}

/** The card's body in Review: the visit's current resting and task results, as shown above. */
export function ScalpMaps({
  rest,
  task,
}: {
  rest: RecordingView | null;
  task: RecordingView | null;
}) {
  const restResults = useShownResults(rest).results.data;
  const taskResults = useShownResults(task).results.data;
  return <ScalpMapPanel rest={restResults} task={taskResults} />;
}
