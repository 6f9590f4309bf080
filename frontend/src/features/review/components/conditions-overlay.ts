import type { TaskResultsView } from '@gyre/shared';
import { conditionStroke, onsetCurvePoints, type OnsetCurveOverlay } from './onset-curve-spec';

/** Each condition's region-of-interest curve, drawn in the order the conditions were found. */
export function conditionOverlaysOf(task: TaskResultsView): OnsetCurveOverlay[] {
  return task.conditionCurves.map((curve, index) => ({
    name: curve.name,
    ...conditionStroke(index),
    points: onsetCurvePoints(task.timeS, curve),
  }));
}
