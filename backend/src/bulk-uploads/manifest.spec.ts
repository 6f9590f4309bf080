import { GyreException } from '../common/errors/gyre.exception';
import { parseManifest } from './manifest';

const csv = (text: string): Buffer => Buffer.from(text, 'utf8');

describe('parseManifest', () => {
  it('reads RFC 4180 quoting, a BOM, CRLF and columns in any order and case', () => {
    // RFC 4180 §2.6–2.7: a quoted field may hold commas and line breaks; "" is one quote.
    const rows = parseManifest(
      csv(
        '\ufeffFILE,participant_code,Planned_Visit,kind\r\n"a,""b"".edf",P-1,Week 4,task\r\n\r\nc.edf, P-2 ,Baseline,resting\r\n',
      ),
      10,
    );
    expect(rows).toEqual([
      {
        row: 1,
        cells: expect.objectContaining({
          file: 'a,"b".edf',
          participant_code: 'P-1',
          planned_visit: 'Week 4',
          kind: 'task',
          onsets_file: '',
        }),
      },
      { row: 2, cells: expect.objectContaining({ file: 'c.edf', participant_code: 'P-2' }) },
    ]);
  });

  it.each([
    ['participant_code,planned_visit,kind\nP,W,task\n', 'column file missing'],
    ['participant_code,planned_visit,kind,file,colour\nP,W,task,f,red\n', "column 'colour' found"],
    ['participant_code,planned_visit,kind,file\nP,W,task\n', 'manifest: Invalid Record Length'],
    ['participant_code,planned_visit,kind,file\n', 'a header without rows'],
    ['participant_code,planned_visit,kind,file\n"P,W,task,f\n', 'manifest: Quote Not Closed'],
  ])('refuses %j naming what is wrong', (text, message) => {
    expect(() => parseManifest(csv(text), 10)).toThrow(message);
  });

  it('refuses more rows than the limit with 422 naming the limit', () => {
    const text = 'participant_code,planned_visit,kind,file\n' + 'P,W,task,f\n'.repeat(3);
    let error: unknown;
    try {
      parseManifest(csv(text), 2);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(GyreException);
    expect((error as GyreException).code).toBe('BULK_UPLOAD_TOO_MANY_ROWS');
    expect((error as GyreException).message).toContain('3 rows found, at most 2');
  });
});
