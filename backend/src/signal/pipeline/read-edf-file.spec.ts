import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { readEdf } from '../edf/edf-reader';
import {
  assemble,
  edfPlus,
  eegSignal,
  int16le,
  plainEdfParts,
} from '../edf/testing/hand-built-edf';
import { scratchFolder } from '../testing/scratch-folder';
import { readEdfFile, SampleArena } from './read-edf-file';

// Files are hand-built byte by byte to the EDF/EDF+ layout (Kemp et al. 1992; Kemp &
// Olivan 2003), generated test data; the reference is `readEdf` on the whole file.
describe('readEdfFile (streamed from disk)', () => {
  const { dir, write, remove } = scratchFolder('gyre-read-edf-file-');
  afterAll(remove);

  /** Plain EDF with three signals; O1 and ECG hold values outside their digital range. */
  function outOfRangeEdf(): Uint8Array {
    const parts = plainEdfParts();
    parts.signals.push({ ...eegSignal('ECG', 2) });
    parts.fixed.signalCount = '3';
    parts.fixed.headerBytes = String(256 * 4);
    const record = (o1: number[], pz: number[], ecg: number[]): number[] => [
      ...int16le(o1),
      ...int16le(pz),
      ...int16le(ecg),
    ];
    parts.data = [
      ...record([-3000, 1, 2, 3], [0, 0], [5000, 6000]),
      ...record([1, 2, 3, 4], [2047, -2048], [0, 1]),
      ...record([9, 8, 7, 3000], [0, 1], [-2049, 2]),
    ];
    return assemble(parts);
  }

  it.each([2, 6, 1 << 20])(
    'gives readEdf’s recording and warnings with chunks of %i bytes',
    async (chunkBytes) => {
      const bytes = outOfRangeEdf();
      const path = write(`range-${chunkBytes}.edf`, bytes);
      const whole = readEdf(bytes);
      // Out-of-range counts in file order for every signal, decoded or not.
      expect(whole.warnings.filter((w) => /digital range/.test(w))).toHaveLength(2);

      const onlyPz = (s: { label: string }): boolean => s.label === 'Pz';
      const read = await readEdfFile(path, { chunkBytes, selectSignal: onlyPz });
      const recording = read.finish();
      expect(recording.signals.map((s) => s.label)).toEqual(['Pz']);
      expect(Array.from(recording.signals[0].samples)).toEqual(
        Array.from(whole.signals[1].samples),
      );
      expect(recording.warnings).toEqual(whole.warnings);
      expect(recording.recordStartsS).toEqual(whole.recordStartsS);
      expect(read.ordinarySignals?.map((s) => s.label)).toEqual(['EEG O1-REF', 'Pz', 'ECG']);

      const none = (await readEdfFile(path, { chunkBytes, selectSignal: () => false })).finish();
      expect(none.signals).toHaveLength(0);
      expect(none.warnings).toEqual(whole.warnings);

      const all = (await readEdfFile(path, { chunkBytes })).finish();
      expect(all.warnings).toEqual(whole.warnings);
      expect(all.signals.map((s) => Array.from(s.samples))).toEqual(
        whole.signals.map((s) => Array.from(s.samples)),
      );
    },
  );

  it('decodes into a SampleArena reused read after read, every sample overwritten', async () => {
    const bytes = outOfRangeEdf();
    const path = write('arena.edf', bytes);
    const whole = readEdf(bytes);
    const arena = new SampleArena();
    const first = (await readEdfFile(path, { chunkBytes: 6, allocateSamples: arena.allocate }))
      .finish()
      .signals.map((s) => s.samples);
    expect(first.map((s) => Array.from(s))).toEqual(
      whole.signals.map((s) => Array.from(s.samples)),
    );
    // The next read gets the same memory: poison it, then read only ECG into it.
    const block = first[0].buffer;
    new Float32Array(block).fill(Number.NaN);
    const onlyEcg = (s: { label: string }): boolean => s.label === 'ECG';
    const second = (
      await readEdfFile(path, { selectSignal: onlyEcg, allocateSamples: arena.allocate })
    ).finish();
    expect(second.signals[0].samples.buffer).toBe(block);
    expect(Array.from(second.signals[0].samples)).toEqual(Array.from(whole.signals[2].samples));
    expect(second.warnings).toEqual(whole.warnings);
  });

  it('refuses sample buffers of the wrong length', async () => {
    const path = write('wrong-length.edf', outOfRangeEdf());
    const read = await readEdfFile(path, {
      allocateSamples: (lengths) => lengths.map((n) => new Float32Array(n + 1)),
    });
    // O1 has 4 samples per record over 3 records (Kemp et al. 1992: recordCount × spr).
    expect(() => read.finish()).toThrow(
      /allocateSamples: expected 12 samples for signal 1, got 13/,
    );
  });

  it('keeps the EDF+ annotations and record times', async () => {
    const bytes = edfPlus();
    const path = write('plus.edf', bytes);
    const whole = readEdf(bytes);
    const recording = (
      await readEdfFile(path, { chunkBytes: 10, selectSignal: () => false })
    ).finish();
    expect(recording.annotations).toEqual(whole.annotations);
    expect(recording.durationS).toBe(whole.durationS);
    expect(recording.header).toEqual(whole.header);
  });

  it('throws readEdf’s error from finish(), after passing every byte to onChunk', async () => {
    const parts = plainEdfParts();
    parts.fixed.recordCount = '4'; // one record more than the data holds
    const bytes = assemble(parts);
    const path = write('short.edf', bytes);
    let expected = '';
    try {
      readEdf(bytes);
    } catch (error) {
      expected = (error as Error).message;
    }
    expect(expected).not.toBe('');
    const hash = createHash('sha256');
    const read = await readEdfFile(path, { chunkBytes: 64, onChunk: (c) => hash.update(c) });
    expect(hash.digest('hex')).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(() => read.finish()).toThrow(expected);
  });

  it('refuses an odd chunk length and reports a missing file as the file system does', async () => {
    await expect(readEdfFile(join(dir, 'x.edf'), { chunkBytes: 3 })).rejects.toThrow(
      /chunkBytes: expected an even integer ≥ 2, got 3/,
    );
    await expect(readEdfFile(join(dir, 'missing.edf'))).rejects.toThrow(/ENOENT/);
  });
});
