import { REPORT_COLORS, ReportCanvas } from './report-canvas';
import {
  amplitudeGateWords,
  conditionWords,
  cycleWords,
  differenceLabel,
  differenceNote,
  differenceWords,
  disagreementWarning,
} from './report-wording';
import { formatDeltaHz } from './report-numbers';
import { TaskSection } from './visit-report-model';

/**
 * The task's conditions (one row each, then their difference, labelled as one), the
 * cycle-by-cycle estimate beside the phase-based one with the disagreement warning, and the
 * amplitude gate. Draws nothing for a task without any of these.
 */
export function drawTaskDepth(canvas: ReportCanvas, task: TaskSection | null): void {
  const depth = task?.depth;
  if (task === null || depth === undefined || task.roiUsage.status === 'none') return;
  canvas.heading('Task: conditions and cross-checks');
  if (depth.conditions.length > 0) {
    canvas.paragraph('Δf per condition (onset label), region of interest', { role: 'medium' });
    canvas.gap(2);
    canvas.facts(depth.conditions.map((c) => [c.label, conditionWords(c)]));
    const difference = depth.conditionDifference;
    if (difference !== null) {
      canvas.facts([[differenceLabel(difference), differenceWords(difference), 'medium']]);
      canvas.gap(1);
      canvas.paragraph(differenceNote(difference), { sizePt: 8, color: REPORT_COLORS.muted });
    }
    canvas.gap(6);
  }
  if (depth.cycles !== null) {
    canvas.paragraph('Cross-check: cycle-by-cycle estimate', { role: 'medium' });
    canvas.gap(2);
    canvas.facts([
      ['Δf, phase-based', task.deltaFHz === null ? 'not available' : formatDeltaHz(task.deltaFHz)],
      ['Δf, cycle-by-cycle', cycleWords(depth.cycles)],
    ]);
    const warning = disagreementWarning(depth);
    if (warning !== null) {
      canvas.gap(1);
      canvas.paragraph(warning, { role: 'medium', color: REPORT_COLORS.amber });
    }
    canvas.gap(1);
    canvas.paragraph(
      'Cycle-by-cycle: frequency from the period between successive extrema of the ' +
        'band-limited signal, in detected bursts only (Cole & Voytek 2019).',
      { sizePt: 8, color: REPORT_COLORS.muted },
    );
    canvas.gap(6);
  }
  if (depth.amplitudeGate !== null) {
    canvas.facts([['Amplitude gate', amplitudeGateWords(depth.amplitudeGate)]]);
  }
}
