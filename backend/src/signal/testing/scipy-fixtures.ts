/**
 * For tests: the numpy/scipy reference outputs that backend/scripts/scipy_reference.py
 * wrote to backend/test/fixtures/scipy, and the error measure the signal specs use on them.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

const SCIPY_FIXTURES = join(__dirname, '../../../test/fixtures/scipy');

/** The parsed JSON file `name` of backend/test/fixtures/scipy (shape declared by the caller). */
export function readScipyFixture<Fixture>(name: string): Fixture {
  return JSON.parse(readFileSync(join(SCIPY_FIXTURES, name), 'utf8')) as Fixture;
}

/** max |a − b| relative to max |b|: a relative error that ignores zero crossings. */
export function relativeError(actual: ArrayLike<number>, expected: ArrayLike<number>): number {
  let diff = 0;
  let scale = 0;
  for (let i = 0; i < expected.length; i++) {
    diff = Math.max(diff, Math.abs(actual[i] - expected[i]));
    scale = Math.max(scale, Math.abs(expected[i]));
  }
  return diff / scale;
}
