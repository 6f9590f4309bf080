import { describe, expect, it } from 'vitest';
import { rejectionAdvice } from './rejection-advice';

// EDF spec (Kemp et al. 1992): file size = 256 × (1 + ns) header bytes + records × Σ(2 × samples
// per record). 6 channels at 256 samples per 1 s record: 1,792 + 60 × 3,072 = 186,112 bytes.
const HEADER = 256 * (1 + 6);
const RECORD = 6 * 256 * 2;
const WHOLE = HEADER + 60 * RECORD;

describe('rejectionAdvice', () => {
  it('turns the header check of a cut file into the expected and actual size', () => {
    const size = WHOLE - 1000; // cut 1,000 bytes: record 60 holds 2,072 of 3,072 bytes
    const advice = rejectionAdvice(
      {
        message: 'x',
        field: 'data records',
        found: `file ends ${RECORD - 1000} bytes into record 60 of 60`,
        expected: `${RECORD} bytes per record`,
      },
      size,
    );
    expect(advice.problem).toBe(
      'The file ends before its header says it should (expected 186,112 bytes, got 185,112 bytes).',
    );
    expect(advice.action).toMatch(/export it again from the recorder/);
  });

  it("reads the streaming reader's and the record count's wording the same way", () => {
    const size = HEADER + 55 * RECORD + 100;
    expect(
      rejectionAdvice(
        {
          message: 'x',
          field: 'data records',
          found: '55 complete records and 100 bytes',
          expected: `60 records of ${RECORD} bytes`,
        },
        size,
      ).problem,
    ).toBe(
      `The file ends before its header says it should (expected 186,112 bytes, got ${new Intl.NumberFormat('en-GB').format(size)} bytes).`,
    );
    expect(
      rejectionAdvice(
        {
          message: 'x',
          field: 'number of data records',
          found: '60',
          expected: `58, as the file holds 58 records of ${RECORD} bytes`,
        },
        HEADER + 58 * RECORD,
      ).problem,
    ).toBe(
      'The file ends before its header says it should (expected 186,112 bytes, got 179,968 bytes).',
    );
  });

  it('tells a file longer than its header, a file of another format and an onset CSV with a resting file apart', () => {
    expect(
      rejectionAdvice({
        message: 'x',
        field: 'file length',
        found: `${WHOLE + 10} bytes`,
        expected: `${HEADER} header + 60 records × ${RECORD} bytes = ${WHOLE} bytes`,
      }).problem,
    ).toBe(
      'The file is longer than its header says (expected 186,112 bytes, got 186,122 bytes): extra data follows the recording.',
    );
    expect(
      rejectionAdvice({
        message: 'x',
        field: 'version',
        found: "0xFF followed by 'BIOSEMX'",
        expected: "'0' (EDF) or 0xFF 'BIOSEMI' (BDF)",
      }).problem,
    ).toBe(
      "This file does not start like an EDF or BDF file (version 0xFF followed by 'BIOSEMX').",
    );
    expect(
      rejectionAdvice({
        message: 'x',
        field: 'onsets',
        found: 'an onset CSV with a resting recording',
        expected: 'onsets only with a task recording',
      }).problem,
    ).toBe('An onset CSV only goes with a task recording.');
  });

  it('keeps an unknown problem in the server words with an action', () => {
    const advice = rejectionAdvice({
      message: 'The file could not be checked: out of memory',
      field: null,
      found: null,
      expected: null,
    });
    expect(advice.problem).toBe('The file could not be checked: out of memory');
    expect(advice.action).toMatch(/export the recording again/i);
  });
});
