import type { TaskResultsDto } from '@gyre/shared';
import { Typography } from 'antd';
import { useMemo } from 'react';
import { HeatmapCanvas, type HeatmapMatrix } from '../../../components/charts/heatmap-canvas';

/** Packs the raster rows into one array; a null cell (dropped, undefined) becomes NaN. */
export function rasterMatrix(raster: TaskResultsDto['raster']): HeatmapMatrix {
  const rows = raster.trials.length;
  const columns = raster.timeS.length;
  const values = new Float64Array(rows * columns).fill(Number.NaN);
  raster.trials.forEach((trial, row) => {
    for (let column = 0; column < columns; column += 1) {
      const value = trial[column];
      if (value !== null && value !== undefined) values[row * columns + column] = value;
    }
  });
  return {
    values,
    rows,
    columns,
    xRange: [raster.timeS[0] ?? 0, raster.timeS[columns - 1] ?? 0],
  };
}

/** Trials × time, colour = instantaneous frequency, on the run's band. */
export function TrialRaster({ task, bandHz }: { task: TaskResultsDto; bandHz: [number, number] }) {
  const matrix = useMemo(() => rasterMatrix(task.raster), [task.raster]);
  if (matrix.rows === 0 || matrix.columns === 0) {
    return (
      <Typography.Text type="secondary">No trial was kept, so there is no raster.</Typography.Text>
    );
  }
  return (
    <HeatmapCanvas
      label="Trial raster"
      matrix={matrix}
      colourDomain={bandHz}
      xTitle="Time from onset (s)"
      yTitle="Trial"
      legendTitle="Instantaneous frequency (Hz)"
      formatLegend={(v) => `${v.toFixed(1)} Hz`}
      verticalMarkers={[0]}
      heightPx={Math.min(360, Math.max(200, matrix.rows * 4 + 48))}
    />
  );
}
