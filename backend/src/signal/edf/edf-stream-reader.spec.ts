import { EdfFormatError } from './edf-format-error';
import { readEdf } from './edf-reader';
import { EdfStreamReader } from './edf-stream-reader';
import { edfPlus, plainEdf } from './testing/hand-built-edf';

/** Pushes `bytes` in pieces of the given sizes (cycled), reusing one scratch buffer. */
function readInPieces(bytes: Uint8Array, sizes: number[]): ReturnType<typeof readEdf> {
  const reader = new EdfStreamReader(bytes.length);
  const scratch = new Uint8Array(Math.max(...sizes));
  let pos = 0;
  for (let i = 0; pos < bytes.length; i++) {
    const n = Math.min(sizes[i % sizes.length], bytes.length - pos);
    scratch.set(bytes.subarray(pos, pos + n));
    reader.push(scratch.subarray(0, n));
    scratch.fill(0xee); // the reader must not keep a reference to a pushed chunk
    pos += n;
  }
  return reader.finish();
}

describe('EdfStreamReader (file in pieces; Kemp et al. 1992 record layout)', () => {
  it.each([[[1]], [[7]], [[13, 1, 300]], [[256]], [[1000]], [[3, 500, 2]]])(
    'gives the same recording as readEdf with pieces of %j bytes',
    (sizes) => {
      for (const bytes of [plainEdf(), edfPlus(), edfPlus(undefined, 'EDF+D')]) {
        const whole = readEdf(bytes);
        const pieces = readInPieces(bytes, sizes);
        expect(pieces.header).toEqual(whole.header);
        expect(pieces.annotations).toEqual(whole.annotations);
        expect(Array.from(pieces.recordStartsS)).toEqual(Array.from(whole.recordStartsS));
        expect(pieces.signals.map((s) => Array.from(s.samples))).toEqual(
          whole.signals.map((s) => Array.from(s.samples)),
        );
      }
    },
  );

  it('fails on the header before any data arrives', () => {
    const bytes = plainEdf();
    bytes[0] = '9'.charCodeAt(0); // Kemp et al. 1992: version must be '0'
    const reader = new EdfStreamReader(bytes.length);
    expect(() => reader.push(bytes.subarray(0, 256))).toThrow(
      /version: '9' found, '0' \(EDF\) or 0xFF 'BIOSEMI' \(BDF\) expected/,
    );
  });

  it('fails early when the announced size cannot hold the header', () => {
    const reader = new EdfStreamReader(300);
    expect(() => reader.push(plainEdf().subarray(0, 256))).toThrow(
      /at least the header's 256 × \(1 \+ 2 signals\)/,
    );
  });

  it('fails when the stream ends early or goes past the announced size', () => {
    const bytes = plainEdf();
    const short = new EdfStreamReader(bytes.length);
    short.push(bytes.subarray(0, bytes.length - 12));
    expect(() => short.finish()).toThrow(EdfFormatError);
    expect(() => short.finish()).toThrow(
      /2 complete records and 0 bytes found, 3 records of 12 bytes/,
    );
    const long = new EdfStreamReader(bytes.length);
    long.push(bytes);
    expect(() => long.push(new Uint8Array(1))).toThrow(/file length/);
  });

  it('reports a short header at finish', () => {
    const reader = new EdfStreamReader(1000);
    reader.push(plainEdf().subarray(0, 100));
    expect(() => reader.finish()).toThrow(/file length: 100 bytes found/);
  });
});
