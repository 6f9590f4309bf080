import { randomInt } from 'node:crypto';

/**
 * Letters and digits of a blinded-review code, without the look-alikes 0/O and 1/I/L: 31
 * characters, so four of them give 923,521 codes per study.
 */
export const BLIND_CODE_ALPHABET = '23456789ABCDEFGHJKMNPQRSTUVWXYZ';
const LENGTH = 4;

/** A fresh random code (`B-7KQ2`) not in `taken`, drawn from the operating system's CSPRNG. */
export function newBlindCode(taken: ReadonlySet<string>): string {
  for (;;) {
    let code = 'B-';
    for (let i = 0; i < LENGTH; i += 1)
      code += BLIND_CODE_ALPHABET[randomInt(BLIND_CODE_ALPHABET.length)];
    if (!taken.has(code)) return code;
  }
}
