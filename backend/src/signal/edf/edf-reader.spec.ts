import { EdfDecoder } from 'edfdecoder';
import { readEdf } from './edf-reader';
import { readEdfHeader, requiredHeaderBytes } from './edf-header';
import { toMicrovolts } from './edf-units';
import {
  assemble,
  edfPlus,
  edfPlusParts,
  int16le,
  plainEdf,
  plainEdfParts,
  talBytes,
} from './testing/hand-built-edf';

/** Kemp et al. 1992: physical = (digital − dmin)·(pmax − pmin)/(dmax − dmin) + pmin. */
const physical = (d: number, dmin = -2048, dmax = 2047, pmin = -200, pmax = 200): number =>
  ((d - dmin) * (pmax - pmin)) / (dmax - dmin) + pmin;

describe('readEdf on a plain EDF file written byte by byte', () => {
  const rec = readEdf(plainEdf());

  it('reads every main-header field', () => {
    // Kemp et al. 1992 header layout: 8 version, 80 patient, 80 recording, 8 date, 8 time,
    // 8 header bytes, 44 reserved, 8 records, 8 duration, 4 signals.
    expect(rec.header).toEqual({
      version: '0',
      patientId: 'P-0042 M 02-MAR-1951 Some_Name',
      recordingId: 'Startdate 14-JUL-1999 lab tech amp',
      startDate: '1999-07-14T08:05:30', // '14.07.99': yy 85–99 → 19yy (Kemp & Olivan 2003 clipping date)
      headerBytes: 768, // 256 × (1 + 2)
      reserved: '',
      format: 'EDF',
      recordCount: 3,
      recordDurationS: 1,
      signalCount: 2,
    });
  });

  it('reads each signal header and its own sampling rate', () => {
    // Kemp et al. 1992: samples per record / record duration = sampling rate; may differ.
    expect(rec.signals.map((s) => [s.label, s.samplesPerRecord, s.sampleRateHz])).toEqual([
      ['EEG O1-REF', 4, 4],
      ['Pz', 2, 2],
    ]);
    const o1 = rec.signals[0];
    expect(o1.transducer).toBe('AgAgCl electrode');
    expect(o1.physicalDimension).toBe('uV');
    expect(o1.prefiltering).toBe('HP:0.1Hz LP:75Hz');
    expect([o1.physicalMin, o1.physicalMax, o1.digitalMin, o1.digitalMax]).toEqual([
      -200, 200, -2048, 2047,
    ]);
  });

  it('converts digital to physical values and concatenates records', () => {
    const o1 = Array.from(rec.signals[0].samples);
    const expected = [-2048, 2047, 0, -1, 1, 2, 3, 4, -5, -6, -7, -8].map((d) => physical(d));
    // dmin → pmin and dmax → pmax exactly (Kemp et al. 1992)
    expect(o1[0]).toBe(-200);
    expect(o1[1]).toBe(200);
    o1.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 4));
    const pz = Array.from(rec.signals[1].samples);
    [100, -100, 2047, -2048, 0, 1].forEach((d, i) => expect(pz[i]).toBeCloseTo(physical(d), 4));
    expect(rec.signals[1].samples).toBeInstanceOf(Float32Array);
  });

  it('gives record starts and duration of a plain EDF file', () => {
    // Kemp et al. 1992: plain EDF records are contiguous.
    expect(Array.from(rec.recordStartsS)).toEqual([0, 1, 2]);
    expect(rec.durationS).toBe(3);
    expect(rec.annotations).toEqual([]);
    expect(rec.warnings).toEqual([]);
  });

  it('agrees with edfdecoder 0.1.2, an independent decoder, on the physical values', () => {
    const bytes = plainEdf();
    const decoder = new EdfDecoder();
    decoder.setInput(bytes.slice().buffer); // edfdecoder needs a real ArrayBuffer (its own documentation)
    decoder.decode();
    const out = decoder.getOutput();
    expect(out).not.toBeNull();
    if (!out) return;
    expect(out.getNumberOfSignals()).toBe(2);
    for (let i = 0; i < 2; i++) {
      const theirs = out.getPhysicalSignalConcatRecords(i);
      const ours = rec.signals[i].samples;
      expect(ours.length).toBe(theirs.length);
      ours.forEach((v, k) => expect(v).toBeCloseTo(theirs[k], 3));
      expect(out.getSignalSamplingFrequency(i)).toBe(rec.signals[i].sampleRateHz);
    }
  });

  it('reads the same values from a buffer at an odd byte offset', () => {
    const bytes = plainEdf();
    const host = new Uint8Array(bytes.length + 1);
    host.set(bytes, 1);
    const shifted = readEdf(host.subarray(1));
    expect(Array.from(shifted.signals[0].samples)).toEqual(Array.from(rec.signals[0].samples));
    expect(Array.from(shifted.signals[1].samples)).toEqual(Array.from(rec.signals[1].samples));
  });

  it('decodes only the selected signals when asked', () => {
    const only = readEdf(plainEdf(), { selectSignal: (s) => s.label === 'Pz' });
    expect(only.signals.map((s) => s.label)).toEqual(['Pz']);
  });
});

describe('start date: two-digit years (Kemp & Olivan 2003: clipping date 1985)', () => {
  const withDate = (startDate: string, recording = ''): Uint8Array => {
    const parts = plainEdfParts();
    return assemble({ ...parts, fixed: { ...parts.fixed, startDate, recording } });
  };
  it.each([
    ['01.01.85', '1985-01-01'], // 85 → 1985, first year after the clipping date
    ['31.12.99', '1999-12-31'],
    ['01.01.00', '2000-01-01'], // 00 → 2000
    ['29.02.00', '2000-02-29'], // 2000 is a leap year (Gregorian calendar)
    ['31.12.84', '2084-12-31'], // 84 → 2084, last two-digit year
  ])('%s → %s', (field, iso) => {
    expect(readEdf(withDate(field)).header.startDate).toBe(`${iso}T08:05:30`);
  });

  it("reads 'yy' from the EDF+ recording field after 2084", () => {
    // Kemp & Olivan 2003: after 2084 yy = 'yy' and the recording field's Startdate gives the year.
    const parts = edfPlusParts();
    const bytes = assemble({
      ...parts,
      fixed: { ...parts.fixed, startDate: '02.03.yy', recording: 'Startdate 02-MAR-2090 X X X' },
    });
    expect(readEdf(bytes).header.startDate).toBe('2090-03-02T14:30:00');
  });

  it('warns when the EDF+ Startdate subfield disagrees with the start date field', () => {
    const parts = edfPlusParts();
    const bytes = assemble({
      ...parts,
      fixed: { ...parts.fixed, recording: 'Startdate 03-MAR-2002 X X X' },
    });
    expect(readEdf(bytes).warnings.join(' ')).toMatch(/Startdate 2002-03-03/);
  });
});

describe('readEdf on EDF+ files written byte by byte (Kemp & Olivan 2003)', () => {
  it('reads EDF+C annotations: duration, several texts in one TAL, UTF-8, negative onset', () => {
    const rec = readEdf(edfPlus());
    expect(rec.header.format).toBe('EDF+C');
    expect(rec.header.startDate).toBe('2002-03-02T14:30:00');
    // The annotation signal is not an ordinary signal.
    expect(rec.signals.map((s) => s.label)).toEqual(['EEG O2-REF']);
    expect(rec.signals[0].sampleRateHz).toBe(8); // 4 samples per 0.5 s record
    // Time-keeping TALs ('+0', '+0.5' with an empty first text) are not annotations.
    expect(rec.annotations).toEqual([
      { onsetS: 0.25, durationS: 0.1, text: 'Stim A' },
      { onsetS: 0.75, durationS: null, text: 'Lights off' },
      { onsetS: 0.75, durationS: null, text: 'Close door' },
      { onsetS: -0.5, durationS: null, text: 'Reiz \u00f6 \u00b5' },
    ]);
    expect(Array.from(rec.recordStartsS)).toEqual([0, 0.5]);
    expect(rec.durationS).toBe(1);
    // Ordinary samples still decode with the annotation signal interleaved.
    const expected = [0, 1, 2, 3, 1, 2, 3, 4].map((d) => physical(d));
    Array.from(rec.signals[0].samples).forEach((v, i) => expect(v).toBeCloseTo(expected[i], 4));
  });

  it('reads annotation texts that share the time-keeping TAL', () => {
    // Kemp & Olivan 2003: the time-keeping TAL's first text is empty; more may follow.
    const rec = readEdf(edfPlus(['+0\x14\x14Recording starts\x14\x00', '+0.5\x14\x14\x00']));
    expect(rec.annotations).toEqual([{ onsetS: 0, durationS: null, text: 'Recording starts' }]);
  });

  it('reads EDF+C with a sub-second first record start', () => {
    // Kemp & Olivan 2003: the first time-keeping TAL may hold the start's fraction of a second.
    const rec = readEdf(edfPlus(['+0.2\x14\x14\x00', '+0.7\x14\x14\x00']));
    expect(Array.from(rec.recordStartsS)).toEqual([0.2, 0.7]);
    expect(rec.durationS).toBeCloseTo(1.2, 12);
  });

  it('reads EDF+D record start times from the time-keeping TALs', () => {
    const rec = readEdf(
      edfPlus(
        ['+0\x14\x14\x00', '+10\x14\x14\x00', '+25.5\x14\x14\x00+26\x14Gap ends\x14\x00'],
        'EDF+D',
      ),
    );
    expect(rec.header.format).toBe('EDF+D');
    expect(Array.from(rec.recordStartsS)).toEqual([0, 10, 25.5]);
    expect(rec.durationS).toBe(26); // end of the last record: 25.5 + 0.5
    expect(rec.annotations).toEqual([{ onsetS: 26, durationS: null, text: 'Gap ends' }]);
  });

  it('reads annotations from a second EDF Annotations signal (no time-keeping there)', () => {
    const parts = edfPlusParts(['+0\x14\x14\x00', '+0.5\x14\x14\x00']);
    const ann2 = { ...parts.signals[1], samplesPerRecord: '10' };
    const data: number[] = [];
    const second = ['+0.1\x14Eyes closed\x14\x00', ''];
    for (let r = 0; r < 2; r++) {
      const first = talBytes(r === 0 ? '+0\x14\x14\x00' : '+0.5\x14\x14\x00', 60);
      data.push(...int16le([0, 0, 0, 0]), ...first, ...talBytes(second[r], 20));
    }
    const bytes = assemble({
      fixed: { ...parts.fixed, headerBytes: '1024', signalCount: '3' },
      signals: [...parts.signals, ann2],
      data,
    });
    expect(readEdf(bytes).annotations).toEqual([
      { onsetS: 0.1, durationS: null, text: 'Eyes closed' },
    ]);
  });
});

describe('readEdfHeader while an upload streams', () => {
  it('needs 256 × (1 + ns) bytes, then validates header and file size', () => {
    const bytes = plainEdf();
    // Kemp et al. 1992: header length = 256 + ns × 256.
    expect(requiredHeaderBytes(bytes.subarray(0, 256))).toBe(768);
    const info = readEdfHeader(bytes.subarray(0, 768), bytes.length);
    expect(info.header.recordCount).toBe(3);
    expect(info.recordBytes).toBe(2 * (4 + 2)); // 2 bytes per sample
    expect(info.annotationSignalIndices).toEqual([]);
    expect(() => readEdfHeader(bytes.subarray(0, 768), bytes.length - 1)).toThrow(
      /truncated last record/,
    );
  });

  it('lists annotation signals of an EDF+ header', () => {
    const bytes = edfPlus();
    expect(readEdfHeader(bytes, bytes.length).annotationSignalIndices).toEqual([1]);
  });
});

describe('warnings', () => {
  it('warns (does not fail) when no EEG channel of the region of interest is present', () => {
    // docs/method.md §1: posterior region of interest; missing channels are a warning.
    const parts = plainEdfParts();
    parts.signals[0].label = 'EEG Fp1-REF';
    parts.signals[1].label = 'ECG';
    const rec = readEdf(assemble(parts));
    expect(rec.signals).toHaveLength(2);
    expect(rec.warnings.join(' ')).toMatch(/No EEG channel of the posterior region of interest/);
  });

  it('counts samples outside the digital range', () => {
    const parts = plainEdfParts();
    parts.data.splice(0, 2, ...int16le([-3000]));
    expect(readEdf(assemble(parts)).warnings.join(' ')).toMatch(
      /1 samples outside its digital range/,
    );
  });
});

describe('toMicrovolts', () => {
  it.each([
    ['uV', 1], // Kemp & Olivan 2003 standard text for microvolt
    ['mV', 1000],
    ['V', 1e6],
    ['nV', 0.001],
    ['%', null],
    ['', null],
  ])('%s → %s', (unit, factor) => {
    expect(toMicrovolts({ physicalDimension: unit })).toBe(factor);
  });
});
