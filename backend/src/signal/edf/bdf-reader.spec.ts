/**
 * BDF and BDF+ (24-bit) files written byte by byte to the format's public description
 * (testing/hand-built-bdf.ts: BioSemi's BDF file format; van Beelen's BDF+ description; EDF
 * layout of Kemp et al. 1992 and TALs of Kemp & Olivan 2003), read by Gyre's reader and
 * compared with closed-form values and with numpy's decoding of the same bytes
 * (scripts/bdf_decode_reference.py). Also the record count −1 (Kemp & Olivan 2003: a file
 * still being recorded) in EDF and BDF.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { seededUniform } from '../random/random';
import { readEdfFile } from '../pipeline/read-edf-file';
import { EdfFormatError } from './edf-format-error';
import { readEdfHeader } from './edf-header';
import { blankPatientField, blankRecordingField } from './edf-patient-field';
import { readEdf } from './edf-reader';
import { EdfStreamReader } from './edf-stream-reader';
import type { EdfRecording } from './edf.types';
import {
  assembleBdf,
  bdfAnnotationSignal,
  bdfEegSignal,
  bdfPlusParts,
  bdfTalBytes,
  BDF_VERSION,
  int24le,
  PLAIN_BDF_O1,
  PLAIN_BDF_PZ,
  plainBdfParts,
  versionBytes,
  type BdfParts,
} from './testing/hand-built-bdf';
import { assemble, plainEdf, plainEdfParts } from './testing/hand-built-edf';

/** Kemp et al. 1992: physical = (d − dmin)·(pmax − pmin)/(dmax − dmin) + pmin, stored as Float32. */
const physical = (d: number, pmin: number, pmax: number, dmin: number, dmax: number): number =>
  Math.fround((d - dmin) * ((pmax - pmin) / (dmax - dmin)) + pmin);
const bioSemi = (d: number): number => physical(d, -262144, 262143, -8388608, 8388607);

const plainWith = (change: (p: BdfParts) => void): Uint8Array => {
  const parts = plainBdfParts();
  change(parts);
  return assembleBdf(parts);
};
const plusWith = (
  change: (p: BdfParts) => void,
  tals?: string[],
  reserved?: string,
): Uint8Array => {
  const parts = bdfPlusParts(tals, reserved);
  change(parts);
  return assembleBdf(parts);
};

function formatError(bytes: Uint8Array): EdfFormatError {
  try {
    readEdf(bytes);
  } catch (error) {
    if (error instanceof EdfFormatError) return error;
    throw error;
  }
  throw new Error('expected an EdfFormatError, the file was read');
}

function inPieces(bytes: Uint8Array, size: number): EdfRecording {
  const reader = new EdfStreamReader(bytes.byteLength);
  for (let at = 0; at < bytes.byteLength; at += size) reader.push(bytes.slice(at, at + size));
  return reader.finish();
}

describe('BDF (BioSemi 24-bit) written byte by byte', () => {
  it('decodes 3-byte little-endian two’s-complement samples to the closed-form physical values', () => {
    const recording = readEdf(assembleBdf(plainBdfParts()));
    expect(recording.header.format).toBe('BDF');
    expect(recording.header.version).toBe('0xFF BIOSEMI');
    expect(recording.header.reserved).toBe('24BIT');
    expect(recording.header.recordCount).toBe(3);
    expect(recording.signals.map((s) => [s.label, s.sampleRateHz])).toEqual([
      ['EEG O1-REF', 4],
      ['Pz', 2],
    ]);
    expect(Array.from(recording.signals[0].samples)).toEqual(PLAIN_BDF_O1.flat().map(bioSemi));
    expect(Array.from(recording.signals[1].samples)).toEqual(PLAIN_BDF_PZ.flat().map(bioSemi));
    // The 24-bit extremes are the physical extremes (BioSemi: dmin..dmax ↔ pmin..pmax).
    expect(recording.signals[0].samples[0]).toBe(-262144);
    expect(recording.signals[0].samples[1]).toBe(262143);
    expect(recording.warnings.filter((w) => /outside its digital range/.test(w))).toEqual([]);
    expect(recording.durationS).toBe(3);
  });

  it('reads BDF+C annotations from a BDF Annotations signal of 3 bytes per sample', () => {
    const recording = readEdf(assembleBdf(bdfPlusParts()));
    expect(recording.header.format).toBe('BDF+C');
    expect(recording.signals.map((s) => s.label)).toEqual(['EEG O2-REF']);
    expect(recording.annotations).toEqual([
      { onsetS: 0.25, durationS: 0.1, text: 'Stim A' },
      { onsetS: 0.75, durationS: null, text: 'Lights off' },
    ]);
    expect(Array.from(recording.recordStartsS)).toEqual([0, 0.5]);
    expect(Array.from(recording.signals[0].samples)).toEqual(
      [0, 0, 4000000, -4000000, 1000, -1000, 4000001, -4000001].map(bioSemi),
    );
  });

  it('places BDF+D records at their time-keeping TALs and refuses overlapping BDF+C ones', () => {
    const gap = readEdf(assembleBdf(bdfPlusParts(['+0\x14\x14\x00', '+2\x14\x14\x00'], 'BDF+D')));
    expect(gap.header.format).toBe('BDF+D');
    expect(Array.from(gap.recordStartsS)).toEqual([0, 2]);
    expect(gap.durationS).toBe(2.5);
    const error = formatError(
      assembleBdf(bdfPlusParts(['+0\x14\x14\x00', '+2\x14\x14\x00'], 'BDF+C')),
    );
    expect(error.message).toBe(
      'time-keeping TAL (record 2): start 2 s found, 0.5 s, as BDF+C records are contiguous expected',
    );
  });

  it('gives the same recording whatever the size of the pieces it arrives in', () => {
    for (const bytes of [assembleBdf(plainBdfParts()), assembleBdf(bdfPlusParts())]) {
      const whole = readEdf(bytes);
      for (const size of [1, 2, 3, 5, 7, 100]) expect(inPieces(bytes, size)).toEqual(whole);
    }
  });

  it('counts 24-bit values outside a signal’s digital range, also for signals left out, whatever the chunk size', async () => {
    // Pz's declared digital range is narrower than its values (4 of its 6 lie outside).
    const bytes = plainWith((p) => {
      p.signals[1].digitalMin = '-1000';
      p.signals[1].digitalMax = '1000';
    });
    const whole = readEdf(bytes);
    expect(whole.warnings).toContain(
      "Signal 'Pz': 3 samples outside its digital range -1000..1000.",
    );
    const dir = mkdtempSync(join(tmpdir(), 'gyre-bdf-'));
    try {
      const path = join(dir, 'range.bdf');
      writeFileSync(path, bytes);
      for (const chunkBytes of [2, 4, 8, 10, 1024]) {
        const read = await readEdfFile(path, { chunkBytes, selectSignal: (_s, i) => i === 0 });
        const recording = read.finish();
        expect([chunkBytes, recording.warnings]).toEqual([chunkBytes, whole.warnings]);
        expect(recording.signals[0].samples).toEqual(whole.signals[0].samples);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('BDF physical values against numpy on the same bytes (scripts/bdf_decode_reference.py)', () => {
  /**
   * A generated BDF+C file: 3 signals at 256 Hz over 4 records of 1 s, seeded random 24-bit
   * values spanning each signal's digital range, with unequal ranges and offsets.
   */
  function generatedBdfPlus(recordCount: string): Uint8Array {
    const random = seededUniform(24);
    const ranges = [
      { label: 'EEG O1-REF', pmin: '-262144', pmax: '262143', dmin: -8388608, dmax: 8388607 },
      { label: 'EEG Oz-REF', pmin: '-3276.8', pmax: '3276.7', dmin: -100000, dmax: 99999 },
      { label: 'EEG Pz-REF', pmin: '12.5', pmax: '-7.25', dmin: -8000000, dmax: 8300000 },
    ];
    const signals = [
      ...ranges.map((r) => ({
        ...bdfEegSignal(r.label, 256),
        physicalMin: r.pmin,
        physicalMax: r.pmax,
        digitalMin: String(r.dmin),
        digitalMax: String(r.dmax),
      })),
      bdfAnnotationSignal(10),
    ];
    const data: number[] = [];
    for (let rec = 0; rec < 4; rec++) {
      for (const r of ranges) {
        const values = Array.from({ length: 256 }, () =>
          Math.floor(r.dmin + random() * (r.dmax - r.dmin + 1)),
        );
        data.push(...int24le(values));
      }
      data.push(...bdfTalBytes(`+${rec}\x14\x14\x00`, 30));
    }
    return assembleBdf({
      fixed: {
        ...bdfPlusParts().fixed,
        headerBytes: String(256 * 5),
        recordCount,
        recordDuration: '1',
        signalCount: '4',
      },
      signals,
      data,
    });
  }

  interface NumpyDecoding {
    numpy: string;
    signals: Array<{ label: string; digital: number[]; physical: number[] }>;
  }

  function numpyDecoding(bytes: Uint8Array): NumpyDecoding {
    const dir = mkdtempSync(join(tmpdir(), 'gyre-bdf-numpy-'));
    try {
      const path = join(dir, 'generated.bdf');
      writeFileSync(path, bytes);
      const script = resolve(__dirname, '../../../scripts/bdf_decode_reference.py');
      return JSON.parse(
        execFileSync('python3', [script, path], { maxBuffer: 64 << 20 }).toString(),
      ) as NumpyDecoding;
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }

  for (const recordCount of ['4', '-1']) {
    it(`matches numpy's decoding to 1e-9 relative (record count ${recordCount})`, () => {
      const bytes = generatedBdfPlus(recordCount);
      const reference = numpyDecoding(bytes);
      const recording = readEdf(bytes);
      expect(recording.header.recordCount).toBe(4);
      expect(recording.signals.map((s) => s.label)).toEqual(reference.signals.map((s) => s.label));
      let checked = 0;
      let worstToFloat32 = 0;
      let worstToFloat64 = 0;
      recording.signals.forEach((signal, c) => {
        const expected = reference.signals[c].physical;
        expect(signal.samples.length).toBe(expected.length);
        for (let i = 0; i < expected.length; i++) {
          const ours = signal.samples[i];
          // Gyre keeps samples as Float32: numpy's float64 value rounded to Float32 is the
          // value to match (1e-9 relative), and the float64 value itself is within Float32's
          // half unit in the last place (2^-24 relative). Zero is compared absolutely.
          const numpy32 = Math.fround(expected[i]);
          const scale32 = Math.abs(numpy32) || 1;
          const scale64 = Math.abs(expected[i]) || 1;
          worstToFloat32 = Math.max(worstToFloat32, Math.abs(ours - numpy32) / scale32);
          worstToFloat64 = Math.max(worstToFloat64, Math.abs(ours - expected[i]) / scale64);
          checked++;
        }
        // The digital values span the whole declared range: the sign bit is exercised.
        const digital = reference.signals[c].digital;
        expect(Math.min(...digital)).toBeLessThan(0);
        expect(Math.max(...digital)).toBeGreaterThan(0);
      });
      expect(checked).toBe(3 * 4 * 256);
      expect(worstToFloat32).toBeLessThanOrEqual(1e-9);
      expect(worstToFloat64).toBeLessThanOrEqual(2 ** -24);
    });
  }
});

describe('malformed BDF files, each breaking one rule', () => {
  const cases: Array<{ name: string; source: string; bytes: () => Uint8Array; message: string }> = [
    {
      name: 'identification byte 0xFE instead of 0xFF',
      source: 'BioSemi BDF format: byte 1 of the version field is 255',
      bytes: () => plainWith((p) => (p.fixed.version = '\u00feBIOSEMI')),
      message: 'header byte 0 (version): 0xfe found, printable ASCII (0x20–0x7E) expected',
    },
    {
      name: '0xFF followed by something other than BIOSEMI',
      source: "BioSemi BDF format: bytes 2–8 of the version field are 'BIOSEMI'",
      bytes: () => {
        const bytes = assembleBdf(plainBdfParts());
        bytes.set(versionBytes(0xff, 'BIOSEMX'), 0);
        return bytes;
      },
      message:
        "version: 0xFF followed by 'BIOSEMX' found, '0' (EDF) or 0xFF 'BIOSEMI' (BDF) expected",
    },
    {
      name: "reserved field 'BDF+X'",
      source: "van Beelen BDF+: the reserved field starts with 'BDF+C' or 'BDF+D'",
      bytes: () => plainWith((p) => (p.fixed.reserved = 'BDF+X')),
      message:
        "reserved: 'BDF+X' in a BDF file (version 0xFF 'BIOSEMI') found, '24BIT' (BDF) or 'BDF+C' / 'BDF+D' (BDF+) expected",
    },
    {
      name: "EDF+'s reserved field 'EDF+C' under a BDF version",
      source: "BioSemi BDF format ('24BIT'); van Beelen BDF+ ('BDF+C'/'BDF+D')",
      bytes: () => plainWith((p) => (p.fixed.reserved = 'EDF+C')),
      message:
        "reserved: 'EDF+C' in a BDF file (version 0xFF 'BIOSEMI') found, '24BIT' (BDF) or 'BDF+C' / 'BDF+D' (BDF+) expected",
    },
    {
      name: 'last record truncated by 4 bytes',
      source: 'Kemp et al. 1992 (kept by BDF): file = header + records × record size',
      bytes: () => assembleBdf(plainBdfParts()).slice(0, -4),
      message:
        'data records: file ends 14 bytes into record 3 of 3 found, 18 bytes per record expected (truncated last record)',
    },
    {
      name: 'samples written with 2 bytes under a BDF header (3-byte sample count mismatch)',
      source: 'BioSemi BDF format: 3 bytes per sample, so a record holds 3 × 6 = 18 bytes',
      bytes: () =>
        plainWith((p) => {
          p.data = p.data.slice(0, (p.data.length * 2) / 3); // 36 bytes: 2 per sample
        }),
      message:
        'number of data records: 3 found, 2, as the file holds 2 records of 18 bytes expected',
    },
    {
      name: 'samples per record one more than the data holds',
      source: 'Kemp et al. 1992: nr of samples in each data record; BioSemi: 3 bytes each',
      bytes: () => plainWith((p) => (p.signals[0].samplesPerRecord = '5')),
      message:
        'data records: file ends 12 bytes into record 3 of 3 found, 21 bytes per record expected (truncated last record)',
    },
    {
      name: 'digital maximum beyond 24 bits',
      source: 'BioSemi BDF format: 24-bit two’s complement, −8388608..8388607',
      bytes: () => plainWith((p) => (p.signals[1].digitalMax = '8388608')),
      message:
        "signal 2 ('Pz') digital maximum: 8388608 found, -8388608–8388607 (24-bit BDF) expected",
    },
    {
      name: 'digital minimum not below the digital maximum',
      source: 'Kemp et al. 1992: physical = (d − dmin)·(pmax − pmin)/(dmax − dmin) + pmin',
      bytes: () => plainWith((p) => (p.signals[0].digitalMin = '8388607')),
      message:
        "signal 1 ('EEG O1-REF') digital minimum: 8388607 (maximum 8388607) found, less than the digital maximum expected",
    },
    {
      name: "BDF+ whose annotation signal is labelled 'EDF Annotations'",
      source: "van Beelen BDF+: the annotation signal is labelled 'BDF Annotations'",
      bytes: () => plusWith((p) => (p.signals[1].label = 'EDF Annotations')),
      message:
        "'BDF Annotations' signal: none found, at least one in BDF+C (it holds the time-keeping TAL of each data record) expected",
    },
    {
      name: 'BDF+ record without its time-keeping TAL',
      source: 'Kemp & Olivan 2003 (kept by BDF+): each record starts with a time-keeping TAL',
      bytes: () => assembleBdf(bdfPlusParts(['+0\x14\x14\x00', '+0.75\x14Late\x14\x00'])),
      message:
        "time-keeping TAL (record 2, signal 2): a TAL whose first text is 'Late' found, a first TAL '+<record start>' 0x14 0x14 (empty first text) expected",
    },
  ];

  for (const c of cases) {
    it(`${c.name} (${c.source})`, () => {
      expect(formatError(c.bytes()).message).toBe(c.message);
    });
  }
});

describe('number of data records −1 (Kemp & Olivan 2003: the file is still being recorded)', () => {
  const edfWithCount = (count: string, extra: number[] = []): Uint8Array => {
    const parts = plainEdfParts();
    parts.fixed.recordCount = count;
    parts.data.push(...extra);
    return assemble(parts);
  };

  it('EDF: counts the records from the file size when the bytes after the header are whole records', () => {
    const recording = readEdf(edfWithCount('-1'));
    const known = readEdf(plainEdf());
    expect(recording.header.recordCount).toBe(3);
    expect(recording.signals).toEqual(known.signals);
    expect(recording.durationS).toBe(known.durationS);
    expect(recording.warnings).toContain(
      'The number of data records is -1 (the file was closed while recording); 3 records of 12 bytes were counted from the file size.',
    );
    expect(inPieces(edfWithCount('-1'), 5)).toEqual(recording);
  });

  it('BDF and BDF+: the same rule with 3-byte records', () => {
    const bdf = readEdf(plainWith((p) => (p.fixed.recordCount = '-1')));
    expect(bdf.header.recordCount).toBe(3);
    expect(Array.from(bdf.signals[0].samples)).toEqual(PLAIN_BDF_O1.flat().map(bioSemi));
    const plus = readEdf(plusWith((p) => (p.fixed.recordCount = '-1')));
    expect(plus.header.recordCount).toBe(2);
    expect(plus.annotations.map((a) => a.text)).toEqual(['Stim A', 'Lights off']);
  });

  it('refuses a size that is not a whole number of records, naming both numbers', () => {
    expect(formatError(edfWithCount('-1', [9, 9, 9, 9, 9])).message).toBe(
      'number of data records: -1 (unknown, written while recording) with 41 bytes after the header found, bytes after the header that are a whole number (at least 1) of data records of 12 bytes expected',
    );
    const bdf = plainWith((p) => {
      p.fixed.recordCount = '-1';
      p.data.push(1, 2, 3, 4);
    });
    expect(formatError(bdf).message).toBe(
      'number of data records: -1 (unknown, written while recording) with 58 bytes after the header found, bytes after the header that are a whole number (at least 1) of data records of 18 bytes expected',
    );
    const headerOnly = plainWith((p) => {
      p.fixed.recordCount = '-1';
      p.data = [];
    });
    expect(formatError(headerOnly).message).toMatch(/with 0 bytes after the header found/);
    // The header alone (as an upload streams) gives the same answers.
    expect(() => readEdfHeader(bdf, bdf.byteLength)).toThrow(/58 bytes after the header/);
    expect(readEdfHeader(edfWithCount('-1'), 804).header.recordCount).toBe(3);
  });
});

describe('blanking the identifying fields of a BDF/BDF+ header (as for EDF/EDF+)', () => {
  it('BDF+ gets X X X X and Startdate <date> X X X, and stays a readable BDF+ file', () => {
    const bytes = assembleBdf(bdfPlusParts());
    blankPatientField(bytes);
    blankRecordingField(bytes);
    const text = (from: number, to: number): string =>
      String.fromCharCode(...bytes.subarray(from, to));
    expect(text(8, 88)).toBe('X X X X'.padEnd(80, ' '));
    expect(text(88, 168)).toBe('Startdate 02-MAR-2002 X X X'.padEnd(80, ' '));
    expect(Array.from(bytes.subarray(0, 8))).toEqual(
      Array.from(BDF_VERSION, (c) => c.charCodeAt(0)),
    );
    const recording = readEdf(bytes);
    expect(recording.header.format).toBe('BDF+C');
    expect(recording.header.patientId).toBe('X X X X');
    expect(recording.signals).toEqual(readEdf(assembleBdf(bdfPlusParts())).signals);
  });

  it('plain BDF gets spaces in both fields', () => {
    const bytes = assembleBdf(plainBdfParts());
    blankPatientField(bytes);
    blankRecordingField(bytes);
    expect(Array.from(bytes.subarray(8, 168)).every((b) => b === 0x20)).toBe(true);
    expect(readEdf(bytes).header.format).toBe('BDF');
  });
});
