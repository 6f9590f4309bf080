/**
 * The valid files the fuzzer starts from: several shapes of EDF and EDF+ (Kemp et al. 1992;
 * Kemp & Olivan 2003) written by the signal core's own writer from generated signals, plus
 * one assembled byte by byte (two annotation signals, which the writer does not produce).
 * Small on purpose (a few to 60 kB): ten thousand mutations must read in well under a minute,
 * and a reader bug does not need a long file to show.
 */
import type { EdfAnnotation, EdfWriteSignal } from '../../signal/edf';
import { writeEdf } from '../../signal/edf';
import {
  annotationSignal,
  assemble,
  eegSignal,
  int16le,
  talBytes,
} from '../../signal/edf/testing/hand-built-edf';
import {
  syntheticRestRecording,
  syntheticTaskRecording,
} from '../../signal/synthetic/synthetic-eeg';

export interface EdfShape {
  name: string;
  bytes: Uint8Array;
  format: 'EDF' | 'EDF+C' | 'EDF+D';
  /** Seconds from the header's start to the end of the last record. */
  durationS: number;
  /** Stimulus onsets (seconds) the shape carries, for onset CSVs built beside it. */
  onsetsS: number[];
}

const POSTERIOR = ['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF', 'EEG Fz-REF'];
// prettier-ignore
const TEN_TWENTY = [
  'Fp1', 'Fp2', 'F7', 'F3', 'Fz', 'F4', 'F8', 'T3', 'C3', 'Cz',
  'C4', 'T4', 'T5', 'P3', 'Pz', 'P4', 'T6', 'O1', 'O2',
];

function signalsOf(
  recording: {
    signals: ReadonlyArray<{ label: string; sampleRateHz: number; samples: Float32Array }>;
  },
  range: { physicalMin: number; physicalMax: number } = { physicalMin: -500, physicalMax: 500 },
): EdfWriteSignal[] {
  return recording.signals.map((s) => ({
    label: s.label,
    sampleRateHz: s.sampleRateHz,
    ...range,
    samples: s.samples,
  }));
}

function every(fromS: number, toS: number, stepS: number): number[] {
  const out: number[] = [];
  for (let t = fromS; t <= toS + 1e-9; t += stepS) out.push(Math.round(t * 1000) / 1000);
  return out;
}

/** Signals of one rate, generated (resting alpha at 10 Hz over noise). */
function rest(labels: readonly string[], rateHz: number, durationS: number, seed: number) {
  return syntheticRestRecording({
    sampleRateHz: rateHz,
    durationS,
    channelLabels: labels,
    peakHz: 10,
    seed,
  });
}

function task(labels: readonly string[], rateHz: number, durationS: number, onsetsS: number[]) {
  return syntheticTaskRecording({
    sampleRateHz: rateHz,
    durationS,
    channelLabels: labels,
    onsetsS,
    seed: 11,
  });
}

/** EDF+C with two `EDF Annotations` signals, assembled from literal field texts. */
function twoAnnotationSignals(): EdfShape {
  const records = 4;
  const signals = [eegSignal('EEG O1-REF', 32), annotationSignal(24), annotationSignal(16)];
  const data: number[] = [];
  for (let r = 0; r < records; r++) {
    const samples = Array.from({ length: 32 }, (_, k) => Math.round(1000 * Math.sin(k + r)));
    data.push(...int16le(samples));
    // Time-keeping TAL first in the first annotation signal (Kemp & Olivan 2003).
    data.push(...talBytes(`+${r}\x14\x14\x00+${r}.5\x14stimulus\x14\x00`, 48));
    data.push(...talBytes(r % 2 === 0 ? `+${r}.25\x150.5\x14Artifact\x14\x00` : '', 32));
  }
  const bytes = assemble({
    fixed: {
      version: '0',
      patient: 'X X X X',
      recording: 'Startdate 15-JAN-2026 X X X',
      startDate: '15.01.26',
      startTime: '09.30.00',
      headerBytes: String(256 * 4),
      reserved: 'EDF+C',
      recordCount: String(records),
      recordDuration: '1',
      signalCount: '3',
    },
    signals,
    data,
  });
  return {
    name: 'edf+c-two-annotation-signals',
    bytes,
    format: 'EDF+C',
    durationS: records,
    onsetsS: [0.5, 1.5, 2.5, 3.5],
  };
}

let cached: EdfShape[] | null = null;

/** Every base shape, generated once per process (deterministic: fixed generator seeds). */
export function edfShapes(): EdfShape[] {
  cached ??= buildShapes();
  return cached;
}

function buildShapes(): EdfShape[] {
  const start = '2026-01-15T09:30:00';
  const shapes: EdfShape[] = [];

  shapes.push({
    name: 'edf-2ch-128hz-1s-records',
    format: 'EDF',
    bytes: writeEdf({
      format: 'EDF',
      startDate: start,
      signals: signalsOf(rest(['O1', 'O2'], 128, 8, 1)),
    }),
    durationS: 8,
    onsetsS: [],
  });

  const stim4 = every(1, 10, 2);
  const annotated: EdfAnnotation[] = [
    ...stim4.map((onsetS) => ({ onsetS, durationS: null, text: 'stimulus' })),
    { onsetS: 4.5, durationS: 0.75, text: 'Artifact: blink' },
    { onsetS: 6.25, durationS: null, text: 'Reiz ö µ' },
  ].sort((a, b) => a.onsetS - b.onsetS);
  shapes.push({
    name: 'edf+c-4ch-256hz-1s-stimuli',
    format: 'EDF+C',
    bytes: writeEdf({
      startDate: start,
      signals: signalsOf(task(POSTERIOR, 256, 12, stim4)),
      annotations: annotated,
    }),
    durationS: 12,
    onsetsS: stim4,
  });

  const gapStarts = Array.from({ length: 16 }, (_, r) => r * 0.5 + (r >= 8 ? 3 : 0));
  const stimD = [0.75, 2.25, 3.1, 7.6, 9.2, 10.4];
  shapes.push({
    name: 'edf+d-3ch-200hz-0.5s-gaps',
    format: 'EDF+D',
    bytes: writeEdf({
      format: 'EDF+D',
      startDate: start,
      recordDurationS: 0.5,
      recordStartsS: gapStarts,
      annotationBytesPerRecord: 400,
      signals: signalsOf(task(POSTERIOR.slice(0, 3), 200, 8, stimD)),
      annotations: stimD.map((onsetS) => ({ onsetS, durationS: 0.1, text: 'go' })),
    }),
    durationS: gapStarts[15] + 0.5,
    onsetsS: stimD,
  });

  const mixed = task(POSTERIOR.slice(0, 3), 256, 6, [1, 2.5, 4]);
  const rates = [256, 128, 64];
  shapes.push({
    name: 'edf+c-mixed-rates-0.25s-wide-tals',
    format: 'EDF+C',
    bytes: writeEdf({
      startDate: start,
      recordDurationS: 0.25,
      // Room for long TALs: a 400-digit onset must fit, to reach the reader's number parsing.
      annotationBytesPerRecord: 512,
      signals: mixed.signals.map((s, i) => ({
        label: s.label,
        sampleRateHz: rates[i],
        physicalMin: -500,
        physicalMax: 500,
        samples: s.samples.filter((_, k) => k % (256 / rates[i]) === 0),
      })),
      annotations: [1, 2.5, 4].map((onsetS) => ({ onsetS, durationS: null, text: 'stimulus' })),
    }),
    durationS: 6,
    onsetsS: [1, 2.5, 4],
  });

  shapes.push({
    name: 'edf+c-1ch-100hz-2s-timekeeping-only',
    format: 'EDF+C',
    bytes: writeEdf({
      startDate: start,
      recordDurationS: 2,
      signals: signalsOf(rest(['Pz'], 100, 10, 2)),
    }),
    durationS: 10,
    onsetsS: [],
  });

  shapes.push({
    name: 'edf-19ch-250hz-1s-records',
    format: 'EDF',
    bytes: writeEdf({
      format: 'EDF',
      startDate: '1999-12-31T23:59:59',
      signals: signalsOf(rest(TEN_TWENTY, 250, 5, 3), {
        physicalMin: -3276.8,
        physicalMax: 3276.7,
      }),
    }),
    durationS: 5,
    onsetsS: [],
  });

  const sparse = every(0.5, 2.5, 0.5);
  shapes.push({
    name: 'edf+c-10hz-0.1s-one-sample-records',
    format: 'EDF+C',
    bytes: writeEdf({
      startDate: start,
      recordDurationS: 0.1,
      signals: signalsOf(task(['O1', 'O2'], 10, 3, sparse)),
      annotations: sparse.map((onsetS) => ({ onsetS, durationS: null, text: 'stimulus' })),
    }),
    durationS: 3,
    onsetsS: sparse,
  });

  shapes.push({
    name: 'edf-2ch-50hz-10s-records-12bit',
    format: 'EDF',
    bytes: writeEdf({
      format: 'EDF',
      startDate: start,
      recordDurationS: 10,
      signals: rest(['O1', 'Oz'], 50, 30, 4).signals.map((s) => ({
        label: s.label,
        sampleRateHz: 50,
        physicalMin: -204.8,
        physicalMax: 204.7,
        digitalMin: -2048,
        digitalMax: 2047,
        samples: s.samples,
      })),
    }),
    durationS: 30,
    onsetsS: [],
  });

  shapes.push(twoAnnotationSignals());
  return shapes;
}
