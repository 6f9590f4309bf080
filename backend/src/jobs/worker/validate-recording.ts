import { readFile } from 'node:fs/promises';
import { roiChannels } from '../../signal/channels';
import { EdfFormatError, readEdf } from '../../signal/edf';
import { OnsetCsvError, parseOnsetCsv } from '../../signal/onsets';
import type { ValidateOutcome, ValidateTask } from './worker-tasks';

/**
 * Reads the whole uploaded file with the signal core's EDF/EDF+ reader (every record,
 * every annotation) and the onset CSV against the recording's duration. Any problem
 * becomes a rejection carrying the reader's own message.
 */
export async function validateRecording(task: ValidateTask): Promise<ValidateOutcome> {
  const bytes = await readFile(task.filePath);
  try {
    const recording = readEdf(bytes);
    if (recording.signals.length === 0) {
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
    if (task.kind === 'task' && csvOnsets === null && recording.annotations.length === 0) {
      return reject(
        'onsets',
        'no onset CSV and no EDF+ annotations',
        'stimulus onsets for a task recording (an onset_s,label CSV or EDF+ annotations)',
      );
    }
    const labels = recording.signals.map((s) => s.label);
    return {
      ok: true,
      facts: {
        format: recording.header.format,
        durationS: recording.durationS,
        recordCount: recording.header.recordCount,
        recordDurationS: recording.header.recordDurationS,
        channelLabels: labels,
        sampleRatesHz: recording.signals.map((s) => s.sampleRateHz),
        roiChannels: roiChannels(labels).map((c) => c.canonical),
        annotationCount: recording.annotations.length,
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
