import { roiChannels } from '../../signal/channels';
import { EdfFormatError } from '../../signal/edf';
import {
  artefactRegExp,
  OnsetCsvError,
  parseOnsetCsv,
  stimulusAnnotations,
} from '../../signal/onsets';
import { DEFAULT_ANALYSIS_COMPUTATION } from '../../signal/pipeline/analysis-computation';
import { readEdfFile } from '../../signal/pipeline/read-edf-file';
import type { ValidateOutcome, ValidateTask } from './worker-tasks';

/**
 * Reads the whole uploaded file with the signal core's EDF/EDF+ reader (every record,
 * every annotation; streamed, no samples kept) and the onset CSV against the
 * recording's duration. Any problem becomes a rejection carrying the reader's own message.
 * Whether the file fits the kind chosen (stimulus onsets for a task, none for a resting
 * recording) is not decided here: the facts carry `stimulusOnsetCount` and the upload
 * asks the technician to confirm a mismatch.
 */
export async function validateRecording(task: ValidateTask): Promise<ValidateOutcome> {
  // Streamed from disk with no signal decoded: every record and annotation is still
  // checked, and digital values outside their range are still counted, without holding
  // the file or its samples in memory.
  const read = await readEdfFile(task.filePath, { selectSignal: () => false });
  try {
    const recording = read.finish();
    const signals = read.ordinarySignals ?? [];
    if (signals.length === 0) {
      return reject('signals', 'only annotation signals', 'at least one EEG signal');
    }
    let csvOnsets: Array<{ onsetS: number; label: string }> | null = null;
    if (task.onsetsCsv !== null) {
      if (task.kind !== 'task') {
        return reject(
          'onsets',
          'an onset CSV with a resting recording',
          'onsets only with a task recording',
        );
      }
      const parsed = parseOnsetCsv(task.onsetsCsv, { recordingDurationS: recording.durationS });
      if (parsed.length === 0) return reject('onsets', 'no onset rows', 'at least one onset');
      csvOnsets = parsed.map((o) => ({ onsetS: o.onsetS, label: o.label }));
    }
    // The analysis's own rule for which annotations are stimuli, so both count the same.
    const artefact = artefactRegExp(DEFAULT_ANALYSIS_COMPUTATION.artefactPattern) as RegExp;
    const stimulusOnsetCount =
      csvOnsets !== null
        ? csvOnsets.length
        : stimulusAnnotations(recording.annotations, artefact).length;
    const labels = signals.map((s) => s.label);
    return {
      ok: true,
      facts: {
        format: recording.header.format,
        durationS: recording.durationS,
        recordCount: recording.header.recordCount,
        recordDurationS: recording.header.recordDurationS,
        channelLabels: labels,
        sampleRatesHz: signals.map((s) => s.sampleRateHz),
        roiChannels: roiChannels(labels).map((c) => c.canonical),
        annotationCount: recording.annotations.length,
        stimulusOnsetCount,
        csvOnsets,
        warnings: recording.warnings,
      },
    };
  } catch (error) {
    if (error instanceof EdfFormatError) {
      return {
        ok: false,
        message: error.message,
        field: error.field,
        found: error.found,
        expected: error.expected,
      };
    }
    if (error instanceof OnsetCsvError) {
      return {
        ok: false,
        message: `onset CSV, ${error.message}`,
        field: 'onsets',
        found: error.value,
        expected: error.expected,
      };
    }
    throw error;
  }
}

function reject(field: string, found: string, expected: string): ValidateOutcome {
  return {
    ok: false,
    message: `${field}: ${found} found, ${expected} expected`,
    field,
    found,
    expected,
  };
}
