/**
 * A file that breaks the EDF/EDF+ specification (Kemp et al. 1992; Kemp & Olivan 2003).
 * `field` names the header field or part of the file, `found` what is there and
 * `expected` what the specification asks for, so the message can be shown as is.
 */
export class EdfFormatError extends Error {
  readonly field: string;
  readonly found: string;
  readonly expected: string;

  constructor(field: string, found: string, expected: string, detail?: string) {
    super(`${field}: ${found} found, ${expected} expected${detail ? ` (${detail})` : ''}`);
    this.name = 'EdfFormatError';
    this.field = field;
    this.found = found;
    this.expected = expected;
  }
}
