import type { RecordingRejection } from '@gyre/shared';

/** A rejection in a technician's words: what is wrong, then what to do about it. */
export interface RejectionAdvice {
  /** What is wrong with the file, in plain words (with the numbers that matter). */
  problem: string;
  /** The suggested action. */
  action: string;
}

// Whole byte counts with thousands separators ("1,234,567 bytes"); lib/format.ts has no
// count formatter yet, and a byte count must not be rounded to kB here.
const COUNT = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });
const bytes = (n: number) => `${COUNT.format(n)} ${n === 1 ? 'byte' : 'bytes'}`;

const EXPORT_AGAIN =
  'The copy may be incomplete: export it again from the recorder and upload the new file.';
const EXPORT_AGAIN_DAMAGED =
  'Export the recording again from the recorder and upload the new file. If the new file is refused too, send the details below to the study’s data manager.';

const int = (text: string | undefined): number | null =>
  text === undefined || !/^\d+$/.test(text) ? null : Number(text);

/**
 * How many bytes the file lacks, read from the EDF reader's own numbers (the EDF specification,
 * Kemp et al. 1992: file size = header bytes + data records × bytes per record); null when the
 * rejection is not about a short file.
 */
function missingBytes(rejection: RecordingRejection): number | null {
  const found = rejection.found ?? '';
  const expected = rejection.expected ?? '';
  if (rejection.field === 'data records') {
    // The header check: "file ends P bytes into record K of N" / "B bytes per record".
    const cut = /^file ends (\d+) bytes into record (\d+) of (\d+)$/.exec(found);
    const per = /^(\d+) bytes per record$/.exec(expected);
    if (cut && per) {
      const [partial, record, count, recordBytes] = [cut[1], cut[2], cut[3], per[1]].map(Number);
      return (count - (record - 1)) * recordBytes - partial;
    }
    // The streaming reader: "R complete records and P bytes" / "N records of B bytes".
    const read = /^(\d+) complete records and (\d+) bytes$/.exec(found);
    const whole = /^(\d+) records of (\d+) bytes$/.exec(expected);
    if (read && whole) {
      const [complete, partial, count, recordBytes] = [read[1], read[2], whole[1], whole[2]].map(
        Number,
      );
      return (count - complete) * recordBytes - partial;
    }
  }
  if (rejection.field === 'number of data records') {
    // "N" / "K, as the file holds K records of B bytes".
    const count = int(found);
    const holds = /^(\d+), as the file holds \d+ records of (\d+) bytes$/.exec(expected);
    if (count !== null && holds) return (count - Number(holds[1])) * Number(holds[2]);
  }
  return null;
}

/**
 * The server's rejection (EDF reader, onset CSV, upload checks: `backend/src/signal/edf`,
 * `signal/onsets`, `jobs/worker/validate-recording.ts`) in plain words with a suggested
 * action. `sizeBytes` is the uploaded file's size, when known, to say how long it should be.
 * The server's own field, found and expected stay shown beside this (RejectionText).
 */
export function rejectionAdvice(
  rejection: RecordingRejection,
  sizeBytes: number | null = null,
): RejectionAdvice {
  const field = rejection.field ?? '';
  const found = rejection.found ?? '';
  const expected = rejection.expected ?? '';

  const missing = missingBytes(rejection);
  if (missing !== null && missing > 0) {
    return {
      problem:
        sizeBytes === null
          ? `The file ends before its header says it should (${bytes(missing)} missing).`
          : `The file ends before its header says it should (expected ${bytes(sizeBytes + missing)}, got ${bytes(sizeBytes)}).`,
      action: EXPORT_AGAIN,
    };
  }
  if (field === 'file length') {
    const got = /^(\d+) bytes$/.exec(found);
    const want = /= (\d+) bytes$/.exec(expected);
    if (got && want) {
      const [g, w] = [Number(got[1]), Number(want[1])];
      return g < w
        ? {
            problem: `The file ends before its header says it should (expected ${bytes(w)}, got ${bytes(g)}).`,
            action: EXPORT_AGAIN,
          }
        : {
            problem: `The file is longer than its header says (expected ${bytes(w)}, got ${bytes(g)}): extra data follows the recording.`,
            action: EXPORT_AGAIN_DAMAGED,
          };
    }
    if (/fixed header|complete header/.test(expected)) {
      return {
        problem: `The file is too short to be an EDF recording (${found}; an EDF header alone is 256 bytes).`,
        action:
          'Check that you chose the recording itself (not a shortcut or an empty export), then upload it again.',
      };
    }
  }
  if (field === 'version') {
    return {
      problem: `This file does not start like an EDF or BDF file (version ${found}).`,
      action:
        'Check that you chose the EDF, EDF+, BDF or BDF+ export of the recording, not another format, and upload it.',
    };
  }
  if (field === 'reserved') {
    return {
      problem: found.includes('BDF file')
        ? 'The header starts like a BDF file but says neither BDF (24BIT) nor BDF+.'
        : 'The header says neither EDF nor EDF+.',
      action: 'Export the recording again as EDF, EDF+, BDF or BDF+ and upload that file.',
    };
  }
  if (field === 'signals') {
    return {
      problem: 'The file holds no EEG channels, only annotations.',
      action: 'Export the recording again with its EEG channels included, and upload the new file.',
    };
  }
  if (field === 'onsets') {
    if (found.includes('resting')) {
      return {
        problem: 'An onset CSV only goes with a task recording.',
        action:
          'Upload the resting file without the CSV, or choose “Task” if this is a task recording.',
      };
    }
    return {
      problem: `The onset CSV could not be used (${found}; ${expected} expected).`,
      action:
        'Correct the CSV (columns onset_s,label; times in seconds inside the recording) and upload the recording with the corrected CSV.',
    };
  }
  if (field === 'kind') {
    return {
      problem: rejection.message,
      action:
        'If this file should count instead, upload it again and replace the current recording, with a reason.',
    };
  }
  if (field === 'file name' || field === 'onset file name') {
    return {
      problem: rejection.message,
      action:
        field === 'file name'
          ? 'Choose the EDF or EDF+ export of the recording (a name ending in .edf).'
          : 'Choose the onset list saved as CSV (a name ending in .csv).',
    };
  }
  if (/^(time-keeping )?TAL\b/.test(field) || field.includes("'EDF Annotations'")) {
    return {
      problem: 'The file’s EDF+ time-keeping annotations are damaged.',
      action: EXPORT_AGAIN_DAMAGED,
    };
  }
  if (/^signal \d+ /.test(field)) {
    const channel = /^signal \d+ \('([^']*)'\) (.+)$/.exec(field);
    return {
      problem:
        channel === null
          ? 'A channel’s settings in the header are not valid.'
          : `The header’s ${channel[2]} of channel ${channel[1] || '(unnamed)'} is not valid (${found}).`,
      action: EXPORT_AGAIN_DAMAGED,
    };
  }
  if (field === 'start date' || field === 'start time' || /^start date/.test(field)) {
    return {
      problem: `The recording’s start ${field.includes('time') ? 'time' : 'date'} in the header is not valid (${found}).`,
      action:
        'Check the recorder’s date and time settings, export the recording again and upload the new file.',
    };
  }
  if (/^header byte \d+/.test(field)) {
    return {
      problem: 'The header holds a character EDF does not allow.',
      action: EXPORT_AGAIN_DAMAGED,
    };
  }
  if (rejection.field === null && /interrupted/i.test(rejection.message)) {
    return {
      problem: 'The upload was cut off by a server restart before the file was kept.',
      action: 'Upload the file again.',
    };
  }
  if (field !== '') {
    return {
      problem: `The file’s header is not valid (${field}: ${found}).`,
      action: EXPORT_AGAIN_DAMAGED,
    };
  }
  return { problem: rejection.message, action: EXPORT_AGAIN_DAMAGED };
}
