import type { EdfSignalHeader } from './edf.types';

/**
 * Voltage units as EDF+ writes them: the header is ASCII, so micro is 'u'
 * (Kemp & Olivan 2003, standard texts: 'uV', 'mV'); 'µV'/'μV' are also accepted for
 * files written by other tools. Matching is exact, because 'mV' and 'MV' differ.
 */
const MICROVOLTS_PER_UNIT: Readonly<Record<string, number>> = {
  nV: 1e-3,
  uV: 1,
  UV: 1,
  '\u00b5V': 1,
  '\u03bcV': 1,
  mV: 1e3,
  V: 1e6,
};

/**
 * Factor that turns this signal's samples into microvolts (samples × factor), or null
 * when its physical dimension is not a voltage (e.g. '%', 'degC', blank).
 * Gyre keeps samples in the file's unit and converts only where µV thresholds apply.
 */
export function toMicrovolts(signal: Pick<EdfSignalHeader, 'physicalDimension'>): number | null {
  return MICROVOLTS_PER_UNIT[signal.physicalDimension.trim()] ?? null;
}
