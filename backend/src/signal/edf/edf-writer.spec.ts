import { EdfFormatError } from './edf-format-error';
import { readEdf } from './edf-reader';
import { writeEdf, type EdfWriteSignal } from './edf-writer';
import { edfPlus, plainEdf, plainEdfParts } from './testing/hand-built-edf';
import { seededUniform } from '../random/random';

/** Kemp et al. 1992: physical = (digital − dmin)·(pmax − pmin)/(dmax − dmin) + pmin. */
const physical = (d: number): number => ((d + 2048) * 400) / 4095 - 200;

const eeg = (label: string, sampleRateHz: number, digital: number[]): EdfWriteSignal => ({
  label,
  sampleRateHz,
  physicalMin: -200,
  physicalMax: 200,
  digitalMin: -2048,
  digitalMax: 2047,
  transducer: 'AgAgCl electrode',
  prefiltering: 'HP:0.1Hz LP:75Hz',
  samples: Float64Array.from(digital, physical),
});

describe('writeEdf against files written byte by byte to the specification', () => {
  it('writes plain EDF identical, byte for byte, to the hand-built file', () => {
    // Kemp et al. 1992 layout; the hand-built file uses no Gyre code (testing/hand-built-edf.ts).
    const written = writeEdf({
      format: 'EDF',
      patientId: 'P-0042 M 02-MAR-1951 Some_Name',
      recordingId: 'Startdate 14-JUL-1999 lab tech amp',
      startDate: '1999-07-14T08:05:30',
      recordDurationS: 1,
      signals: [
        eeg('EEG O1-REF', 4, [-2048, 2047, 0, -1, 1, 2, 3, 4, -5, -6, -7, -8]),
        eeg('Pz', 2, [100, -100, 2047, -2048, 0, 1]),
      ],
    });
    expect(plainEdfParts().fixed.recordCount).toBe('3');
    expect(Buffer.from(written).equals(Buffer.from(plainEdf()))).toBe(true);
  });

  it('writes EDF+C with time-keeping TALs identical to the hand-built file', () => {
    // Kemp & Olivan 2003: 'EDF+C' reserved field, 'EDF Annotations' signal, a time-keeping
    // TAL '+<start>\x14\x14\x00' first in every record, then the record's annotations.
    const written = writeEdf({
      patientId: 'MCH-0234567 F 02-MAY-1951 Haagse_Harry',
      recordingId: 'Startdate 02-MAR-2002 PSG-1234/2002 NN Telemetry03',
      startDate: '2002-03-02T14:30:00',
      recordDurationS: 0.5,
      signals: [
        { ...eeg('EEG O2-REF', 8, [0, 1, 2, 3, 1, 2, 3, 4]), transducer: 'AgAgCl electrode' },
      ],
      annotations: [{ onsetS: 0.25, durationS: 0.1, text: 'Stim A' }],
      annotationBytesPerRecord: 60,
    });
    const handBuilt = edfPlus(['+0\x14\x14\x00+0.25\x150.1\x14Stim A\x14\x00', '+0.5\x14\x14\x00']);
    expect(Buffer.from(written).equals(Buffer.from(handBuilt))).toBe(true);
  });
});

describe('writeEdf then readEdf', () => {
  // Generated test data: the backend's one seeded generator, fixed seed.
  const random = seededUniform(7);

  it('keeps every sample within half a quantisation step', () => {
    const n = 256 * 4;
    const samples = Float32Array.from({ length: n }, () => (random() - 0.5) * 300);
    const bytes = writeEdf({
      startDate: '2024-05-06T07:08:09',
      signals: [
        { label: 'EEG Oz', sampleRateHz: 256, physicalMin: -187.5, physicalMax: 187.5, samples },
        {
          label: 'EEG Pz',
          sampleRateHz: 128,
          physicalMin: -1,
          physicalMax: 1,
          physicalDimension: 'mV',
          samples: Float32Array.from({ length: n / 2 }, () => random() * 2 - 1),
        },
      ],
    });
    const rec = readEdf(bytes);
    expect(rec.header.format).toBe('EDF+C');
    expect(rec.header.startDate).toBe('2024-05-06T07:08:09');
    expect(rec.header.patientId).toBe('X X X X'); // Kemp & Olivan 2003: X = unknown subfield
    expect(rec.header.recordingId).toBe('Startdate 06-MAY-2024 X X X');
    expect(rec.signals.map((s) => s.sampleRateHz)).toEqual([256, 128]);
    expect(rec.signals[1].physicalDimension).toBe('mV');
    // Quantisation step = (pmax − pmin)/(dmax − dmin) (Kemp et al. 1992); rounding error ≤ step/2.
    const step = 375 / 65535;
    let worst = 0;
    rec.signals[0].samples.forEach((v, i) => (worst = Math.max(worst, Math.abs(v - samples[i]))));
    expect(worst).toBeLessThanOrEqual(step / 2 + 1e-4);
    expect(worst).toBeGreaterThan(0);
  });

  it('clips values outside the physical range to the digital extremes', () => {
    const bytes = writeEdf({
      format: 'EDF',
      startDate: '2001-01-01T00:00:00',
      signals: [
        {
          label: 'O1',
          sampleRateHz: 2,
          physicalMin: -100,
          physicalMax: 100,
          samples: Float32Array.from([-500, 500]),
        },
      ],
    });
    expect(Array.from(readEdf(bytes).signals[0].samples)).toEqual([-100, 100]);
  });

  it('writes EDF+D record starts and places each annotation in its record', () => {
    const bytes = writeEdf({
      format: 'EDF+D',
      startDate: '2010-10-10T10:10:10',
      recordDurationS: 2,
      signals: [
        {
          label: 'O1',
          sampleRateHz: 10,
          physicalMin: -1,
          physicalMax: 1,
          samples: new Float32Array(60),
        },
      ],
      recordStartsS: [0, 30.125, 100],
      annotations: [
        { onsetS: 31, durationS: 0.5, text: 'Stimulus \u2013 flash' },
        { onsetS: 1e-6, durationS: null, text: 'tiny onset' },
        { onsetS: 100.5, durationS: 0, text: 'last' },
      ],
    });
    const rec = readEdf(bytes);
    expect(rec.header.format).toBe('EDF+D');
    expect(Array.from(rec.recordStartsS)).toEqual([0, 30.125, 100]);
    expect(rec.durationS).toBe(102);
    expect(rec.annotations).toEqual([
      { onsetS: 1e-6, durationS: null, text: 'tiny onset' },
      { onsetS: 31, durationS: 0.5, text: 'Stimulus \u2013 flash' },
      { onsetS: 100.5, durationS: 0, text: 'last' },
    ]);
    // The 'tiny onset' TAL text must be decimal, never '1e-6' (Kemp & Olivan 2003 TAL grammar).
    expect(Buffer.from(bytes).includes('+0.000001\x14tiny onset')).toBe(true);
  });

  it("writes 'yy' after 2084 with the year in the EDF+ recording field", () => {
    // Kemp & Olivan 2003 clipping-date rule.
    const bytes = writeEdf({
      startDate: '2090-03-02T01:02:03',
      signals: [
        {
          label: 'O1',
          sampleRateHz: 1,
          physicalMin: -1,
          physicalMax: 1,
          samples: new Float32Array(1),
        },
      ],
    });
    expect(String.fromCharCode(...bytes.subarray(168, 176))).toBe('02.03.yy');
    expect(readEdf(bytes).header.startDate).toBe('2090-03-02T01:02:03');
  });
});

describe('writeEdf refuses specs it cannot write', () => {
  const base = {
    startDate: '2020-01-01T00:00:00',
    signals: [
      {
        label: 'O1',
        sampleRateHz: 4,
        physicalMin: -1,
        physicalMax: 1,
        samples: new Float32Array(8),
      },
    ],
  };
  it.each([
    ['rate × duration not whole', { ...base, recordDurationS: 0.3 }, /samples per record/],
    [
      'length not a whole number of records',
      { ...base, signals: [{ ...base.signals[0], samples: new Float32Array(7) }] },
      /a multiple of 4 samples per record/,
    ],
    [
      'signals of different record counts',
      {
        ...base,
        signals: [
          base.signals[0],
          { ...base.signals[0], label: 'O2', samples: new Float32Array(12) },
        ],
      },
      /3 records of data found, 2, as in signals\[0\]/,
    ],
    [
      'annotations in plain EDF',
      { ...base, format: 'EDF' as const, annotations: [{ onsetS: 0, durationS: null, text: 'a' }] },
      /none in plain EDF/,
    ],
    [
      'NaN sample',
      {
        ...base,
        signals: [{ ...base.signals[0], samples: Float32Array.from([0, 0, NaN, 0, 0, 0, 0, 0]) }],
      },
      /samples\[2\]: NaN found/,
    ],
    ['date not ISO', { ...base, startDate: '01.01.20' }, /ISO/],
    ['31 April', { ...base, startDate: '2020-04-31T00:00:00' }, /real calendar date/],
    ['year before 1985', { ...base, startDate: '1984-12-31T00:00:00' }, /a year from 1985/],
    [
      'EDF+D records overlapping',
      { ...base, format: 'EDF+D' as const, recordStartsS: [0, 0.5] },
      /may not overlap/,
    ],
    [
      'physical min = max',
      { ...base, signals: [{ ...base.signals[0], physicalMax: -1 }] },
      /two different values/,
    ],
    [
      'label longer than 16 characters',
      { ...base, signals: [{ ...base.signals[0], label: 'EEG O1-REF-LONGER' }] },
      /at most 16/,
    ],
    [
      'non-ASCII label',
      { ...base, signals: [{ ...base.signals[0], label: 'EEG Ö1' }] },
      /printable ASCII/,
    ],
    [
      'annotation text with 0x14',
      { ...base, annotations: [{ onsetS: 0, durationS: null, text: 'a\u0014b' }] },
      /without 0x00, 0x14 or 0x15/,
    ],
  ])('%s', (_name, spec, message) => {
    expect(() => writeEdf(spec)).toThrow(EdfFormatError);
    expect(() => writeEdf(spec)).toThrow(message);
  });
});
