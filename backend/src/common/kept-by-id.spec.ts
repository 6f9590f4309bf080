import { KeptById } from './kept-by-id';

describe('KeptById', () => {
  it('reads only the ids it does not keep yet, all in one read', () => {
    const kept = new KeptById<string>(10);
    const reads: string[][] = [];
    const read = (missing: string[]): Array<[string, string]> => {
      reads.push(missing);
      return missing.map((id) => [id, `value ${id}`]);
    };
    expect([...kept.get(['a', 'b'], read)]).toEqual([
      ['a', 'value a'],
      ['b', 'value b'],
    ]);
    expect(kept.get(['b', 'c', 'a'], read).get('c')).toBe('value c');
    expect(kept.get(['a', 'c'], read).size).toBe(2);
    expect(reads).toEqual([['a', 'b'], ['c']]);
  });

  it('leaves out an id the read does not answer, and asks for it again next time', () => {
    const kept = new KeptById<number>(10);
    const read = jest.fn((missing: string[]): Array<[string, number]> =>
      missing.filter((id) => id !== 'gone').map((id) => [id, id.length]),
    );
    expect([...kept.get(['one', 'gone'], read).keys()]).toEqual(['one']);
    kept.get(['one', 'gone'], read);
    expect(read).toHaveBeenLastCalledWith(['gone']);
  });

  it('keeps at most `capacity` values, letting the one kept longest go first', () => {
    const kept = new KeptById<string>(2);
    const read = jest.fn((missing: string[]): Array<[string, string]> =>
      missing.map((id) => [id, id]),
    );
    kept.get(['a', 'b'], read);
    kept.get(['c'], read);
    read.mockClear();
    kept.get(['a', 'b', 'c'], read);
    expect(read).toHaveBeenCalledWith(['a']);
  });
});
