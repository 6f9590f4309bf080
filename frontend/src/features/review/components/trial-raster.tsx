import type { TaskResultsView, TrialRasterView } from '@gyre/shared';
import { Skeleton, Typography } from 'antd';
import { useMemo } from 'react';
import { HeatmapCanvas, type HeatmapMatrix } from '../../../components/charts/heatmap-canvas';
import { ReadError } from '../../../components/page-states';
import { useTrialRaster } from '../api/get-trial-raster';

/** The raster's rows in one array; a null cell (dropped, undefined) becomes NaN. */
export function rasterMatrix(raster: TrialRasterView): HeatmapMatrix {
  const { trials: rows, points: columns } = raster;
  const values = Float64Array.from(raster.valuesHz, (v) => v ?? Number.NaN);
  if (values.length !== rows * columns) {
    throw new Error(`The raster holds ${values.length} values, expected ${rows} × ${columns}.`);
  }
  return {
    values,
    rows,
    columns,
    xRange: [raster.timeS[0] ?? 0, raster.timeS[columns - 1] ?? 0],
  };
}

function RasterCanvas({ raster, bandHz }: { raster: TrialRasterView; bandHz: [number, number] }) {
  const matrix = useMemo(() => rasterMatrix(raster), [raster]);
  return (
    <HeatmapCanvas
      label="Trial raster"
      matrix={matrix}
      colourDomain={bandHz}
      xTitle="Time from onset (s)"
      yTitle="Trial"
      legendTitle="Instantaneous frequency (Hz)"
      legendUnit="Hz"
      verticalMarkers={[0]}
      heightPx={Math.min(360, Math.max(200, matrix.rows * 4 + 48))}
    />
  );
}

/**
 * Trials × time, colour = instantaneous frequency, on the run's band. The raster is the
 * heaviest part of a run's results, so it is asked for here, when the chart is shown, and
 * not with the results.
 */
export function TrialRaster({
  recordingId,
  runId,
  task,
  bandHz,
}: {
  recordingId: string;
  runId: string;
  task: TaskResultsView;
  bandHz: [number, number];
}) {
  const empty = task.raster.trials === 0 || task.raster.points === 0;
  const raster = useTrialRaster(empty ? null : recordingId, empty ? null : runId);
  if (empty) {
    return (
      <Typography.Text type="secondary">No trial was kept, so there is no raster.</Typography.Text>
    );
  }
  if (raster.error !== undefined) {
    return <ReadError read={raster} title="The trial raster could not be loaded" />;
  }
  if (raster.data === undefined) {
    return (
      <div aria-busy="true" aria-label="Loading the trial raster">
        <Skeleton active paragraph={{ rows: 4 }} />
      </div>
    );
  }
  return <RasterCanvas raster={raster.data} bandHz={bandHz} />;
}
