import { OnsetCsvError, parseOnsetCsv } from './onset-csv';

const options = { recordingDurationS: 600 };

/** Runs the parser and returns the OnsetCsvError it throws (fails the test otherwise). */
function csvError(text: string): OnsetCsvError {
  try {
    parseOnsetCsv(text, options);
  } catch (e) {
    if (e instanceof OnsetCsvError) return e;
    throw e;
  }
  throw new Error('expected an OnsetCsvError');
}

describe('parseOnsetCsv (docs/method.md §1: onset_s,label[,duration_s])', () => {
  it('reads onsets with and without a duration column', () => {
    expect(parseOnsetCsv('onset_s,label\n1.5,flash\n2,tone\n', options)).toEqual([
      { onsetS: 1.5, label: 'flash', durationS: null, line: 2 },
      { onsetS: 2, label: 'tone', durationS: null, line: 3 },
    ]);
    expect(
      parseOnsetCsv('onset_s,label,duration_s\r\n10,flash,0.2\r\n10,flash,\r\n', options),
    ).toEqual([
      { onsetS: 10, label: 'flash', durationS: 0.2, line: 2 },
      { onsetS: 10, label: 'flash', durationS: null, line: 3 }, // equal onsets: non-decreasing
    ]);
  });

  it('accepts a byte-order mark, quoted labels (RFC 4180) and blank lines', () => {
    const rows = parseOnsetCsv('\uFEFFonset_s,label\n\n3,"flash, red"\n4,"say ""go"""\n', options);
    expect(rows.map((r) => [r.label, r.line])).toEqual([
      ['flash, red', 3],
      ['say "go"', 4],
    ]);
  });

  it.each([
    ['', 1, null, /line 1: header '' found/],
    ['onset,label\n1,a', 1, null, /header row 'onset_s,label'/],
    [
      'onset_s,label\n1.5s,flash',
      2,
      1,
      /^line 2, column 1 \(onset_s\): '1.5s' found, a number of seconds/,
    ],
    ['onset_s,label\n1,5,flash', 2, null, /^line 2: 3 fields found, 2 fields/],
    ['onset_s,label\n1,', 2, 2, /column 2 \(label\): '' found, a non-empty label/],
    [
      'onset_s,label\n5,a\n4.9,b',
      3,
      1,
      /'4.9' found, onsets in non-decreasing order, at least 5 \(line 2\)/,
    ],
    ['onset_s,label\n-1,a', 2, 1, /inside the recording, 0 ≤ onset < 600 s/],
    ['onset_s,label\n600,a', 2, 1, /'600' found/],
    ['onset_s,label,duration_s\n599,a,2', 2, 3, /ends at 601 s.*at most 600 s/],
    ['onset_s,label,duration_s\n1,a,-0.1', 2, 3, /a duration of at least 0 s/],
    ['onset_s,label,duration_s\n1,a,x', 2, 3, /column 3 \(duration_s\): 'x' found/],
    ['onset_s,label\n1,"open', 2, 2, /unclosed quote/],
    ['onset_s,label\n', 1, null, /no onset rows/],
    ['onset_s,label\n1,a\n\n2;b', 4, null, /line 4: 1 fields found/],
    ['onset_s,label\nNaN,a', 2, 1, /'NaN' found/],
  ])('%j → error at line %s, column %s', (text, line, column, message) => {
    const error = csvError(text);
    expect(error.line).toBe(line);
    expect(error.column).toBe(column);
    expect(error.message).toMatch(message);
    expect(error.value.length).toBeGreaterThan(0);
  });
});
