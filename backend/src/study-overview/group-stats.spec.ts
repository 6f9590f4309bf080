import { execFileSync } from 'node:child_process';
import { meanWithInterval } from './group-stats';

/** Runs a Python snippet (numpy / scipy from Debian's python3-numpy, python3-scipy) on JSON. */
function python(script: string, input: unknown): unknown {
  const out = execFileSync('python3', ['-c', script], { input: JSON.stringify(input) });
  return JSON.parse(out.toString());
}

describe('Student t quantile and the 95 % interval of a mean', () => {
  it('gives the same mean and interval as numpy + scipy.stats.t.interval', () => {
    const samples = [
      [10.1, 9.8, 10.4],
      [9.52, 9.61, 9.3, 10.05, 9.9, 9.44, 9.71],
      [-0.42, -0.1, -0.63, -0.2],
      Array.from({ length: 40 }, (_, i) => 9 + Math.sin(i * 1.7) * 0.6),
    ];
    const reference = python(
      `import json,sys\nimport numpy as np\nfrom scipy import stats\nout=[]\nfor v in json.load(sys.stdin):\n  a=np.array(v); m=a.mean(); s=a.std(ddof=1)\n  lo,hi=stats.t.interval(0.95, len(a)-1, loc=m, scale=s/np.sqrt(len(a)))\n  out.append([float(m),float(s),float(lo),float(hi)])\nprint(json.dumps(out))`,
      samples,
    ) as number[][];
    samples.forEach((values, i) => {
      const got = meanWithInterval(values);
      const [mean, sd, low, high] = reference[i];
      expect(got.n).toBe(values.length);
      expect(got.mean).toBeCloseTo(mean, 12);
      expect(got.sd).toBeCloseTo(sd, 12);
      expect(got.ciLow).toBeCloseTo(low, 9);
      expect(got.ciHigh).toBeCloseTo(high, 9);
    });
  });

  it('gives a mean but no interval from one value, and nothing from none', () => {
    expect(meanWithInterval([9.7])).toEqual({
      n: 1,
      mean: 9.7,
      sd: null,
      ciLow: null,
      ciHigh: null,
    });
    expect(meanWithInterval([])).toEqual({
      n: 0,
      mean: null,
      sd: null,
      ciLow: null,
      ciHigh: null,
    });
  });
});
