/**
 * Malformed files, each written byte by byte (testing/hand-built-edf.ts) so that it breaks
 * exactly one rule of Kemp et al. 1992 (EDF) or Kemp & Olivan 2003 (EDF+). Every one must
 * end in an EdfFormatError naming the field, the value found and the value expected,
 * without crashing, hanging, or allocating what a lying header claims.
 */
import { EdfFormatError } from './edf-format-error';
import { readEdf } from './edf-reader';
import { readEdfHeader } from './edf-header';
import {
  assemble,
  edfPlus,
  edfPlusParts,
  eegSignal,
  field,
  int16le,
  plainEdf,
  plainEdfParts,
  rawHeader,
  type RawFixedFields,
  type RawSignalFields,
} from './testing/hand-built-edf';
import { seededUniform } from '../random/random';

type Parts = { fixed: RawFixedFields; signals: RawSignalFields[]; data: number[] };

const plainWith = (change: (p: Parts) => void): Uint8Array => {
  const parts = plainEdfParts();
  change(parts);
  return assemble(parts);
};
const plusWith = (change: (p: Parts) => void, tals?: string[], reserved?: string): Uint8Array => {
  const parts = edfPlusParts(tals, reserved);
  change(parts);
  return assemble(parts);
};
const replaceByte = (bytes: Uint8Array, at: number, value: number): Uint8Array => {
  const copy = bytes.slice();
  copy[at] = value;
  return copy;
};

/** A 12-signal file whose header-bytes field says 3072 (it should be 256 × 13 = 3328). */
function twelveSignalsWrongHeaderBytes(): Uint8Array {
  const signals = Array.from({ length: 12 }, (_, i) => eegSignal(`EEG C${(i % 6) + 1}`, 1));
  const fixed: RawFixedFields = {
    ...plainEdfParts().fixed,
    headerBytes: '3072',
    signalCount: '12',
    recordCount: '1',
  };
  return Uint8Array.from([...rawHeader(fixed, signals), ...int16le(new Array<number>(12).fill(0))]);
}

interface Case {
  name: string;
  source: string;
  bytes: () => Uint8Array;
  field: RegExp;
  message: RegExp;
}

const cases: Case[] = [
  {
    name: 'file shorter than 256 bytes',
    source: 'Kemp et al. 1992: the fixed header is 256 bytes',
    bytes: () => plainEdf().slice(0, 100),
    field: /file length/,
    message: /100 bytes found, at least 256 bytes/,
  },
  {
    name: 'empty file',
    source: 'Kemp et al. 1992: the fixed header is 256 bytes',
    bytes: () => new Uint8Array(0),
    field: /file length/,
    message: /0 bytes found/,
  },
  {
    name: "version field not '0'",
    source: 'Kemp et al. 1992: 8 ascii version of this data format (0)',
    bytes: () => plainWith((p) => (p.fixed.version = '1')),
    field: /^version$/,
    message: /'1' found, '0' \(EDF\) or 0xFF 'BIOSEMI' \(BDF\) expected/,
  },
  {
    name: 'BDF version field (0xFF BIOSEMI) with a blank reserved field',
    source: "BioSemi BDF format: a BDF file's reserved field is '24BIT'",
    bytes: () => {
      const b = plainEdf();
      b.set([0xff, ...field('BIOSEMI', 7)], 0);
      return b;
    },
    field: /^reserved$/,
    message:
      /^reserved: '' in a BDF file .* found, '24BIT' \(BDF\) or 'BDF\+C' \/ 'BDF\+D' \(BDF\+\) expected$/,
  },
  {
    name: "EDF version field ('0') with the BDF reserved field '24BIT'",
    source: "Kemp et al. 1992 version '0' means 16-bit EDF; '24BIT' belongs to BDF (BioSemi)",
    bytes: () => plainWith((p) => (p.fixed.reserved = '24BIT')),
    field: /^reserved$/,
    message: /'24BIT' in an EDF file \(version '0'\) found/,
  },
  {
    name: 'header length does not match the signal count',
    source: 'Kemp et al. 1992: header bytes = 256 + ns × 256',
    bytes: twelveSignalsWrongHeaderBytes,
    field: /^header bytes$/,
    message: /^header bytes: 3072 found, 256 × \(1 \+ 12 signals\) = 3328 expected$/,
  },
  {
    name: 'header-bytes field not a number',
    source: 'Kemp et al. 1992: 8 ascii number of bytes in header record',
    bytes: () => plainWith((p) => (p.fixed.headerBytes = 'abc')),
    field: /^header bytes$/,
    message: /'abc' found, an integer expected/,
  },
  {
    name: 'signal count 0',
    source: 'Kemp et al. 1992: 4 ascii number of signals (ns)',
    bytes: () => plainWith((p) => (p.fixed.signalCount = '0')),
    field: /number of signals/,
    message: /0 found, 1–9999 expected/,
  },
  {
    name: 'signal count absurdly large for the file',
    source: 'Kemp et al. 1992: header = 256 × (1 + ns) bytes, which must fit in the file',
    bytes: () =>
      plainWith((p) => {
        p.fixed.signalCount = '9999';
        p.fixed.headerBytes = '2560000';
      }),
    field: /file length/,
    message: /804 bytes found, at least the header's 256 × \(1 \+ 9999 signals\) = 2560000 bytes/,
  },
  {
    name: 'signal count not a number',
    source: 'Kemp et al. 1992: 4 ascii number of signals',
    bytes: () => plainWith((p) => (p.fixed.signalCount = 'two')),
    field: /number of signals/,
    message: /'two' found, an integer expected/,
  },
  {
    name: 'record count −1 and bytes after the header that are not whole records',
    source:
      'Kemp & Olivan 2003: −1 while recording; the count follows from the size only if it divides',
    bytes: () =>
      plainWith((p) => {
        p.fixed.recordCount = '-1';
        p.data.push(1, 2, 3, 4, 5); // 3 records of 12 bytes + 5: 41 bytes after the header
      }),
    field: /^number of data records$/,
    message:
      /^number of data records: -1 \(unknown, written while recording\) with 41 bytes after the header found, .* data records of 12 bytes expected$/,
  },
  {
    name: 'record count 0',
    source: 'Kemp et al. 1992: 8 ascii number of data records',
    bytes: () => plainWith((p) => (p.fixed.recordCount = '0')),
    field: /number of data records/,
    message: /0 found, at least 1 \(or -1 while recording\) expected/,
  },
  {
    name: 'record count larger than the file holds',
    source: 'Kemp et al. 1992: file = header + records × record size',
    bytes: () => plainWith((p) => (p.fixed.recordCount = '4')),
    field: /number of data records/,
    message: /4 found, 3, as the file holds 3 records of 12 bytes expected/,
  },
  {
    name: 'record count absurdly large (no allocation)',
    source: 'Kemp et al. 1992: file = header + records × record size',
    bytes: () => plainWith((p) => (p.fixed.recordCount = '99999999')),
    field: /number of data records/,
    message: /99999999 found/,
  },
  {
    name: 'bytes after the last record',
    source: 'Kemp et al. 1992: file = header + records × record size',
    bytes: () => plainWith((p) => p.data.push(0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0)),
    field: /file length/,
    message:
      /^file length: 816 bytes found, 768 header \+ 3 records × 12 bytes = 804 bytes expected$/,
  },
  {
    name: 'truncated last record',
    source: 'Kemp et al. 1992: every data record has the same size',
    bytes: () => plainEdf().slice(0, 768 + 12 * 2 + 5),
    field: /data records/,
    message: /file ends 5 bytes into record 3 of 3.*truncated last record/,
  },
  {
    name: 'non-printable byte in the patient field',
    source: 'Kemp et al. 1992 / Kemp & Olivan 2003: header holds printable US-ASCII only',
    bytes: () => replaceByte(plainEdf(), 20, 0x07),
    field: /header byte 20 \(local patient identification\)/,
    message: /0x07 found, printable ASCII/,
  },
  {
    name: 'non-printable (0x00) byte in a signal label',
    source: 'Kemp & Olivan 2003: header holds printable US-ASCII only',
    bytes: () => replaceByte(plainEdf(), 256 + 16 + 3, 0x00),
    field: /header byte 275 \(label of signal 2\)/,
    message: /0x00 found/,
  },
  {
    name: 'non-ASCII (UTF-8) byte in the recording field',
    source: 'Kemp & Olivan 2003: header holds US-ASCII 32..126 only',
    bytes: () => replaceByte(plainEdf(), 100, 0xc3),
    field: /local recording identification/,
    message: /0xc3 found/,
  },
  {
    name: 'digital minimum equal to digital maximum',
    source: 'Kemp et al. 1992: digital minimum < digital maximum',
    bytes: () => plainWith((p) => (p.signals[1].digitalMin = '2047')),
    field: /signal 2 \('Pz'\) digital minimum/,
    message: /2047 \(maximum 2047\) found, less than the digital maximum expected/,
  },
  {
    name: 'digital minimum greater than digital maximum',
    source: 'Kemp et al. 1992: digital minimum < digital maximum',
    bytes: () => plainWith((p) => (p.signals[0].digitalMin = '3000')),
    field: /signal 1 \('EEG O1-REF'\) digital minimum/,
    message: /3000/,
  },
  {
    name: 'digital maximum outside 16 bits',
    source: 'Kemp et al. 1992: samples are 2-byte integers',
    bytes: () => plainWith((p) => (p.signals[0].digitalMax = '40000')),
    field: /digital maximum/,
    message: /40000 found, -32768–32767/,
  },
  {
    name: 'physical minimum equal to physical maximum',
    source:
      'Kemp et al. 1992: physical extremes map to the digital extremes; equal extremes carry no signal (common practice)',
    bytes: () => plainWith((p) => (p.signals[0].physicalMax = '-200')),
    field: /signal 1 \('EEG O1-REF'\) physical minimum/,
    message: /different from the physical maximum/,
  },
  {
    name: 'physical minimum not a number',
    source: 'Kemp et al. 1992: 8 ascii physical minimum',
    bytes: () => plainWith((p) => (p.signals[1].physicalMin = '-2OO')),
    field: /signal 2 \('Pz'\) physical minimum/,
    message: /'-2OO' found, a decimal number expected/,
  },
  {
    name: 'digital maximum not an integer',
    source: 'Kemp et al. 1992: digital extremes are integers',
    bytes: () => plainWith((p) => (p.signals[1].digitalMax = '2047.5')),
    field: /signal 2 \('Pz'\) digital maximum/,
    message: /an integer expected/,
  },
  {
    name: 'samples per record 0',
    source: 'Kemp et al. 1992: nr of samples in each data record',
    bytes: () => plainWith((p) => (p.signals[1].samplesPerRecord = '0')),
    field: /signal 2 \('Pz'\) number of samples in each data record/,
    message: /0 found, at least 1 expected/,
  },
  {
    name: 'samples per record negative',
    source: 'Kemp et al. 1992: nr of samples in each data record',
    bytes: () => plainWith((p) => (p.signals[0].samplesPerRecord = '-5')),
    field: /signal 1 \('EEG O1-REF'\) number of samples/,
    message: /-5 found/,
  },
  {
    name: 'samples per record absurdly large (no allocation)',
    source: 'Kemp et al. 1992: file = header + records × record size',
    bytes: () => plainWith((p) => (p.signals[0].samplesPerRecord = '99999999')),
    field: /^data records$/,
    message: /file ends 36 bytes into record 1 of 3 found, 200000002 bytes per record expected/,
  },
  {
    name: 'record duration 0',
    source: 'Kemp et al. 1992: duration of a data record, in seconds',
    bytes: () => plainWith((p) => (p.fixed.recordDuration = '0')),
    field: /duration of a data record/,
    message: /0 s found, more than 0 s expected/,
  },
  {
    name: 'record duration negative',
    source: 'Kemp et al. 1992: duration of a data record, in seconds',
    bytes: () => plainWith((p) => (p.fixed.recordDuration = '-1')),
    field: /duration of a data record/,
    message: /-1 s found/,
  },
  {
    name: 'record duration not a number',
    source: 'Kemp et al. 1992: 8 ascii duration of a data record',
    bytes: () => plainWith((p) => (p.fixed.recordDuration = '1s')),
    field: /duration of a data record/,
    message: /'1s' found, a decimal number expected/,
  },
  {
    name: 'start date month 13',
    source: 'Kemp et al. 1992: startdate dd.mm.yy',
    bytes: () => plainWith((p) => (p.fixed.startDate = '01.13.99')),
    field: /start date month/,
    message: /'13' found, 01–12 expected/,
  },
  {
    name: 'start date 30 February',
    source: 'Kemp et al. 1992: startdate dd.mm.yy (a real calendar date)',
    bytes: () => plainWith((p) => (p.fixed.startDate = '30.02.01')),
    field: /start date day/,
    message: /'30' found, 01–28 for 2001-02 expected/,
  },
  {
    name: 'start date in another layout',
    source: 'Kemp et al. 1992: startdate dd.mm.yy',
    bytes: () => plainWith((p) => (p.fixed.startDate = '1999-7-1')),
    field: /^start date$/,
    message: /'1999-7-1' found, 'dd.mm.yy' expected/,
  },
  {
    name: 'start time hour 25',
    source: 'Kemp et al. 1992: starttime hh.mm.ss',
    bytes: () => plainWith((p) => (p.fixed.startTime = '25.00.00')),
    field: /start time/,
    message: /'25.00.00' found/,
  },
  {
    name: "'yy' year in plain EDF",
    source: "Kemp & Olivan 2003: 'yy' exists only in EDF+ (after 2084)",
    bytes: () => plainWith((p) => (p.fixed.startDate = '01.01.yy')),
    field: /^start date$/,
    message: /'01.01.yy' found/,
  },
  {
    name: "'yy' year without a later Startdate in the EDF+ recording field",
    source: "Kemp & Olivan 2003: with 'yy' the recording field's Startdate gives the year",
    bytes: () => plusWith((p) => (p.fixed.startDate = '02.03.yy')),
    field: /local recording identification/,
    message: /Startdate year 2002 found/,
  },
  {
    name: "reserved field 'EDF+X'",
    source: "Kemp & Olivan 2003: reserved field starts with 'EDF+C' or 'EDF+D'",
    bytes: () => plusWith((p) => (p.fixed.reserved = 'EDF+X')),
    field: /^reserved$/,
    message: /'EDF\+X' found/,
  },
  {
    name: 'EDF+ without an EDF Annotations signal',
    source: "Kemp & Olivan 2003: EDF+ has at least one 'EDF Annotations' signal",
    bytes: () => plusWith((p) => (p.signals[1].label = 'Marker')),
    field: /'EDF Annotations' signal/,
    message: /none found, at least one in EDF\+C/,
  },
  {
    name: 'EDF+ record without a time-keeping TAL',
    source: 'Kemp & Olivan 2003: each record starts with a time-keeping TAL',
    bytes: () => edfPlus(['+0\x14\x14\x00', '']),
    field: /time-keeping TAL \(record 2, signal 2\)/,
    message: /no TAL found/,
  },
  {
    name: 'EDF+ time-keeping TAL with a non-empty first text',
    source: "Kemp & Olivan 2003: the time-keeping annotation's text is empty",
    bytes: () => edfPlus(['+0\x14Hello\x14\x00', '+0.5\x14\x14\x00']),
    field: /time-keeping TAL \(record 1/,
    message: /first text is 'Hello'/,
  },
  {
    name: 'TAL onset without sign',
    source: "Kemp & Olivan 2003: onset starts with '+' or '-'",
    bytes: () => edfPlus(['+0\x14\x14\x00', '0.5\x14\x14\x00']),
    field: /TAL \(record 2, signal 2, byte 0\)/,
    message: /'0' found, '\+' or '-' starting a TAL onset expected/,
  },
  {
    name: 'TAL onset with a comma',
    source: "Kemp & Olivan 2003: onset uses '.' as decimal separator",
    bytes: () => edfPlus(['+0\x14\x14\x00', '+0,5\x14\x14\x00']),
    field: /TAL \(record 2/,
    message: /',' found, 0x14 after the onset\/duration expected/,
  },
  {
    name: 'TAL duration without digits',
    source: 'Kemp & Olivan 2003: duration = digits after 0x15',
    bytes: () => edfPlus(['+0\x14\x14\x00+0.1\x15\x14x\x14\x00', '+0.5\x14\x14\x00']),
    field: /TAL \(record 1/,
    message: /a digit in the duration expected/,
  },
  {
    name: 'TAL not ended by 0x00',
    source: 'Kemp & Olivan 2003: each TAL ends with 0x00',
    bytes: () => edfPlus(['+0\x14\x14\x00', '+0.5\x14\x14\x00+0.6\x14' + 'x'.repeat(47) + '\x14']),
    field: /TAL \(record 2/,
    message: /end of the annotation bytes found, 0x00 ending the TAL expected/,
  },
  {
    name: 'TAL text not ended by 0x14',
    source: 'Kemp & Olivan 2003: each annotation text ends with 0x14',
    bytes: () => edfPlus(['+0\x14\x14\x00+0.1\x14Stim\x00', '+0.5\x14\x14\x00']),
    field: /TAL \(record 1/,
    message: /0x00 found, 0x14 ending the annotation text expected/,
  },
  {
    name: 'TAL text not valid UTF-8',
    source: 'Kemp & Olivan 2003: annotation texts are UTF-8',
    bytes: () => {
      const b = edfPlus(['+0\x14\x14\x00+0.1\x14AB\x14\x00', '+0.5\x14\x14\x00']);
      const at = 768 + 8 + '+0\x14\x14\x00+0.1\x14'.length;
      b[at] = 0xc3; // lead byte of a 2-byte sequence
      b[at + 1] = 0x28; // not a continuation byte
      return b;
    },
    field: /TAL \(record 1/,
    message: /invalid UTF-8 text found/,
  },
  {
    name: 'EDF+C records that are not contiguous',
    source: 'Kemp & Olivan 2003: EDF+C data records are contiguous',
    bytes: () => edfPlus(['+0\x14\x14\x00', '+5\x14\x14\x00']),
    field: /time-keeping TAL \(record 2\)/,
    message: /start 5 s found, 0.5 s, as EDF\+C records are contiguous/,
  },
  {
    name: 'EDF+D records that overlap',
    source: 'Kemp & Olivan 2003: EDF+D records in time order, not overlapping',
    bytes: () => edfPlus(['+0\x14\x14\x00', '+0.25\x14\x14\x00'], 'EDF+D'),
    field: /time-keeping TAL \(record 2\)/,
    message: /at least 0.5 s/,
  },
];

describe('malformed EDF/EDF+ files written byte by byte', () => {
  it('has at least 25 cases', () => {
    expect(cases.length).toBeGreaterThanOrEqual(25);
  });

  it.each(cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    // Source of the rule: c.source
    expect(c.source.length).toBeGreaterThan(0);
    let error: unknown = null;
    try {
      readEdf(c.bytes());
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(EdfFormatError);
    if (!(error instanceof EdfFormatError)) return;
    expect(error.field).toMatch(c.field);
    expect(error.message).toMatch(c.message);
    expect(error.found.length).toBeGreaterThan(0);
    expect(error.expected.length).toBeGreaterThan(0);
    // One message shape everywhere: '<field>: <found> found, <expected> expected'.
    expect(
      error.message.startsWith(`${error.field}: ${error.found} found, ${error.expected} expected`),
    ).toBe(true);
  });

  it('the header-only validator rejects the header-level cases too', () => {
    // Same rules (Kemp et al. 1992), checked from header + file size while an upload streams.
    const headerLevel = cases.filter((c) => !/TAL|EDF\+C records|EDF\+D records/.test(c.name));
    for (const c of headerLevel) {
      const bytes = c.bytes();
      expect(() => readEdfHeader(bytes, bytes.length)).toThrow(EdfFormatError);
    }
  });
});

describe('robustness (generated inputs)', () => {
  it('every truncation of a valid EDF+ file is an EdfFormatError', () => {
    const full = edfPlus();
    for (let length = 0; length < full.length; length++) {
      expect(() => readEdf(full.subarray(0, length))).toThrow(EdfFormatError);
    }
    expect(() => readEdf(full)).not.toThrow();
  });

  it('random byte changes never give anything but a result or an EdfFormatError', () => {
    // Generated test data: the backend's one seeded generator, fixed seed.
    const random = seededUniform(12345);
    const sources = [plainEdf(), edfPlus(), edfPlus(undefined, 'EDF+D')];
    let failures = 0;
    for (let trial = 0; trial < 3000; trial++) {
      const bytes = sources[trial % sources.length].slice();
      const changes = 1 + Math.floor(random() * 4);
      for (let c = 0; c < changes; c++) {
        bytes[Math.floor(random() * bytes.length)] = Math.floor(random() * 256);
      }
      try {
        const rec = readEdf(bytes);
        // A changed sample byte still decodes: lengths must follow the header.
        for (const s of rec.signals) {
          expect(s.samples.length).toBe(rec.header.recordCount * s.samplesPerRecord);
        }
      } catch (e) {
        if (!(e instanceof EdfFormatError)) throw e;
        failures++;
      }
    }
    expect(failures).toBeGreaterThan(0);
  });
});
