/**
 * EDF/EDF+ reader (Kemp et al. 1992; Kemp & Olivan 2003).
 *
 * Why not edfdecoder 0.1.2: it needs a real ArrayBuffer (a Node Buffer gives null),
 * returns null on a bad file instead of saying what is wrong, knows nothing of EDF+
 * (annotations come back as numbers, no EDF+D record times), parses the start date
 * wrongly (two-digit year not expanded, month off by one), and copies every record
 * into arrays of its own before converting, so a 230 MB file costs several times its
 * size. This reader validates the whole header first (`readEdfHeader`), checks every
 * size against the real byte length before allocating, reads the 16-bit samples in
 * place, and allocates only the output Float32Arrays; `EdfStreamReader` decodes a file
 * arriving in pieces without holding it whole. edfdecoder is still used in the
 * tests, as an independent decoder of plain EDF.
 */
import { EdfStreamReader, type ReadEdfOptions } from './edf-stream-reader';
import type { EdfRecording } from './edf.types';

export type { ReadEdfOptions } from './edf-stream-reader';

/**
 * Reads an EDF or EDF+ (C or D) file held in memory. Throws `EdfFormatError` naming
 * the field, the value found and the value expected when the file breaks the
 * specification. Does not copy `bytes`; the result holds no reference to it.
 * For a file arriving in pieces use `EdfStreamReader`, which this wraps.
 *
 * Physical value = (digital − dmin) · (pmax − pmin) / (dmax − dmin) + pmin
 * (Kemp et al. 1992), kept in the signal's own `physicalDimension` (see `toMicrovolts`).
 */
export function readEdf(bytes: Uint8Array, options: ReadEdfOptions = {}): EdfRecording {
  const reader = new EdfStreamReader(bytes.byteLength, options);
  reader.push(bytes);
  return reader.finish();
}
