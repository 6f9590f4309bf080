/**
 * Case `index` of a run seeded with `seed`: a base shape, one mutation (of the EDF file or of
 * the onset CSV beside it), and the upload's kind. Built from `caseSeed(seed, index)` alone,
 * so `--seed S --case N` rebuilds one case byte for byte without the others.
 */
import { caseSeed, Rng } from '../seeded-random';
import { edfShapes } from './edf-corpus';
import type { EdfShape } from './edf-corpus';
import { layoutOf } from './edf-layout';
import type { EdfLayout } from './edf-layout';
import { EDF_FAMILY_WEIGHTS, mutateEdf } from './edf-mutations';
import { baseOnsetCsv, CSV_FAMILY_WEIGHTS, mutateOnsetCsv } from './onset-csv-mutations';

export type FuzzTarget = 'edf' | 'onset-csv';

export interface FuzzCase {
  seed: number;
  index: number;
  target: FuzzTarget;
  shape: string;
  /** Mutation family (for the summary) and the full description (for a failure report). */
  family: string;
  mutation: string;
  kind: 'task' | 'resting';
  edf: Uint8Array;
  onsetsCsv: string | null;
}

/** Share of cases that mutate the onset CSV (the rest mutate the EDF file). */
const CSV_SHARE = 0.25;

let layouts: Map<string, EdfLayout> | null = null;

function layoutFor(shape: EdfShape): EdfLayout {
  layouts ??= new Map(edfShapes().map((s) => [s.name, layoutOf(s.bytes)]));
  return layouts.get(shape.name) as EdfLayout;
}

export function buildCase(seed: number, index: number): FuzzCase {
  const rng = new Rng(caseSeed(seed, index));
  const shape = rng.pick(edfShapes());
  const base = { seed, index, shape: shape.name };
  if (rng.bool(CSV_SHARE)) {
    const family = rng.weighted(CSV_FAMILY_WEIGHTS);
    const csv = baseOnsetCsv(rng, shape.onsetsS, shape.durationS);
    const mutated = mutateOnsetCsv(csv, family, rng, shape.durationS);
    return {
      ...base,
      target: 'onset-csv',
      family: `csv ${family}`,
      mutation: `csv ${mutated.name}`,
      // Mostly a task upload: a CSV beside a resting recording is refused before parsing.
      kind: rng.bool(0.9) ? 'task' : 'resting',
      edf: shape.bytes,
      onsetsCsv: mutated.text,
    };
  }
  const family = rng.weighted(EDF_FAMILY_WEIGHTS);
  const mutated = mutateEdf(shape.bytes, layoutFor(shape), family, rng);
  // Now and then a valid CSV beside the broken file: the CSV is checked against its duration.
  const withCsv = rng.bool(0.15);
  return {
    ...base,
    target: 'edf',
    family: `edf ${family}`,
    mutation: `edf ${mutated.name}`,
    kind: withCsv || rng.bool() ? 'task' : 'resting',
    edf: mutated.bytes,
    onsetsCsv: withCsv ? baseOnsetCsv(rng, shape.onsetsS, shape.durationS) : null,
  };
}
