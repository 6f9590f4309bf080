import { decodeResultSeries, encodeResultSeries } from './result-series-codec';

describe('result series codec', () => {
  it('round-trips every IEEE 754 double exactly, including NaN, ±Infinity and −0', () => {
    const series = {
      timeS: Float64Array.from({ length: 301 }, (_, i) => -1 + i / 100),
      odd: Float64Array.from([Number.NaN, Infinity, -Infinity, -0, 5e-324, Number.MAX_VALUE]),
      empty: new Float64Array(0),
    };
    const decoded = decodeResultSeries(encodeResultSeries(series));
    expect(Object.keys(decoded)).toEqual(['timeS', 'odd', 'empty']);
    expect(Array.from(decoded.timeS)).toEqual(Array.from(series.timeS));
    expect(Object.is(decoded.odd[3], -0)).toBe(true);
    expect(Number.isNaN(decoded.odd[0])).toBe(true);
    expect(Array.from(decoded.odd.subarray(1))).toEqual(Array.from(series.odd.subarray(1)));
    expect(decoded.empty.length).toBe(0);
  });

  it('refuses a blob that is not a series blob', () => {
    expect(() => decodeResultSeries(Buffer.from('hello world'))).toThrow('not a Gyre series blob');
  });
});
