import { Base } from '@ant-design/charts';
import type { CommonConfig } from '@ant-design/charts';
import type { PlotSpec } from './plot-spec';

/**
 * The only module that imports @ant-design/charts; it is loaded on demand by
 * {@link PlotFigure} so the first page of the app stays small.
 */
export default function G2Plot({ spec, height }: { spec: PlotSpec; height: number }) {
  // The tick labels ride along for the page, not for G2.
  const { axisLabels: _labels, ...g2Spec } = spec;
  // PlotSpec is a narrow, plain-data view of G2's spec; the library's own type is much wider.
  const config = { ...g2Spec, height, autoFit: true } as unknown as CommonConfig;
  return <Base {...config} />;
}
