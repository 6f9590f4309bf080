import { readFileSync } from 'node:fs';
import { join } from 'node:path';

/** Gyre's version, as in backend/package.json; every result records it. */
export const GYRE_VERSION: string = (
  JSON.parse(readFileSync(join(__dirname, '..', 'package.json'), 'utf8')) as { version: string }
).version;
