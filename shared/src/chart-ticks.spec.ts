import { dateAxis, linearAxis, logAxis, tickLabelAt } from './chart-ticks';

const M = '\u2212';
const labels = (axis: { ticks: Array<{ label: string }> }) => axis.ticks.map((t) => t.label);
const values = (axis: { ticks: Array<{ value: number }> }) => axis.ticks.map((t) => t.value);
const utc = (iso: string) => Date.parse(`${iso}T00:00:00Z`);

/** A small seeded generator (Park–Miller), so the property checks are repeatable. */
function seeded(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
}

describe('linear ticks', () => {
  it('gives issue 15 onset-curve y axis distinct labels (hand-counted)', () => {
    // Before: 10.1, 10.0, 9.9, 9.9, 9.8. Span 0.3 / 5 → step 0.05 (nearest 1-2-5), 2 decimals.
    const axis = linearAxis(9.8, 10.1, { count: 5 });
    expect(axis.step).toBeCloseTo(0.05, 12);
    expect(labels(axis)).toEqual(['9.80', '9.85', '9.90', '9.95', '10.00', '10.05', '10.10']);
  });

  it('labels the onset time axis from −1.0 to 2.0 s (hand-counted)', () => {
    const axis = linearAxis(-1, 2, { count: 6, minDecimals: 1 });
    expect(axis.domain).toEqual([-1, 2]);
    expect(labels(axis)).toEqual([`${M}1.0`, `${M}0.5`, '0.0', '0.5', '1.0', '1.5', '2.0']);
    // A grid that stops just inside −1 and 2 is widened to them.
    expect(linearAxis(-0.996, 1.996, { count: 3, minDecimals: 1 }).domain).toEqual([-1, 2]);
    expect(labels(linearAxis(-1, 2, { count: 3, signed: true }))).toEqual([
      `${M}1`,
      '0',
      '+1',
      '+2',
    ]);
  });

  it('widens to whole steps, or keeps the domain when asked (hand-counted)', () => {
    // Span 0.54 / 5 = 0.108: d3 keeps 0.1 (it moves to 0.2 only past √2 × 0.1).
    expect(linearAxis(9.68, 10.22, { count: 5 })).toMatchObject({
      domain: [9.6, 10.3],
      step: 0.1,
      decimals: 1,
    });
    const inside = linearAxis(1, 40, { count: 6, nice: false });
    expect(inside.domain).toEqual([1, 40]);
    expect(labels(inside)).toEqual(['5', '10', '15', '20', '25', '30', '35', '40']);
    // One value: ±0.5 around it, then widened to steps of 0.2.
    expect(linearAxis(10, 10, { count: 5 }).domain).toEqual([9.4, 10.6]);
  });

  it('widens nearly equal values to a minimum span (hand-counted)', () => {
    // 10.100 and 10.103 Hz: without a minimum the step is 0.0005 and the labels run to
    // 10.1035; with 0.1 Hz the extent is 10.0515–10.1515, step 0.02, two decimals.
    expect(linearAxis(10.1, 10.103, { count: 5 }).decimals).toBe(4);
    const axis = linearAxis(10.1, 10.103, { count: 5, minSpan: 0.1 });
    expect(labels(axis)).toEqual(['10.04', '10.06', '10.08', '10.10', '10.12', '10.14', '10.16']);
  });

  it('never repeats a label, always increases and covers the domain (2000 seeded domains)', () => {
    const random = seeded(20261202);
    const broken: string[] = [];
    for (let i = 0; i < 2000; i++) {
      const scale = 10 ** Math.floor(random() * 10 - 5);
      const a = (random() - 0.5) * 20 * scale;
      const b = a + random() * 3 * scale;
      const count = 2 + Math.floor(random() * 10);
      const axis = linearAxis(a, b, { count });
      const v = values(axis);
      const l = labels(axis);
      const ok =
        v.length >= 2 &&
        new Set(l).size === l.length &&
        v.every((x, k) => k === 0 || x > v[k - 1]) &&
        axis.domain[0] <= a &&
        axis.domain[1] >= b &&
        Math.abs(v[0] - axis.domain[0]) <= axis.step * 1e-9 &&
        Math.abs(v[v.length - 1] - axis.domain[1]) <= axis.step * 1e-9 &&
        // Each label reads back as its value to within half a step, with no hyphen or −0.
        l.every(
          (text, k) =>
            Math.abs(Number(text.replace(M, '-')) - v[k]) <= axis.step / 2 &&
            !/^-|^−0(\.0*)?$/.test(text),
        );
      if (!ok) broken.push(`[${a}, ${b}] count ${count}: ${l.join(' ')}`);
    }
    expect(broken).toEqual([]);
  });
});

describe('log ticks', () => {
  it('writes the issue 15 rest-spectrum axis in one notation (hand-counted)', () => {
    // Before: 500, 90, 40, 8, 3, 0.7, 0.2. Four decades 0.1–1000 → powers of ten only.
    const axis = logAxis(0.2, 500, { maxTicks: 8 });
    expect(axis.domain).toEqual([0.1, 1000]);
    expect(labels(axis)).toEqual(['0.1', '1', '10', '100', '1000']);
  });

  it('uses 1-2-5 when few decades fit (hand-counted)', () => {
    expect(labels(logAxis(0.25, 4.8, { maxTicks: 8 }))).toEqual([
      '0.1',
      '0.2',
      '0.5',
      '1',
      '2',
      '5',
      '10',
    ]);
  });

  it('switches every tick to E notation outside 0.001–100 000 (hand-counted)', () => {
    // Eight decades 1e−7 to 10 and 8 ticks at most: every second decade.
    expect(labels(logAxis(3e-7, 4, { maxTicks: 8 }))).toEqual([
      `1e${M}7`,
      `1e${M}5`,
      `1e${M}3`,
      `1e${M}1`,
      '1e1',
    ]);
    expect(labels(logAxis(2e5, 4e6, { maxTicks: 8 }))).toEqual([
      '1e5',
      '2e5',
      '5e5',
      '1e6',
      '2e6',
      '5e6',
      '1e7',
    ]);
  });

  it('keeps ticks distinct and increasing over seeded ranges', () => {
    const random = seeded(7);
    for (let i = 0; i < 500; i++) {
      const low = 10 ** (random() * 12 - 8);
      const high = low * 10 ** (random() * 6 + 0.01);
      const axis = logAxis(low, high, { maxTicks: 2 + Math.floor(random() * 10) });
      const v = values(axis);
      expect(new Set(labels(axis)).size).toBe(v.length);
      for (let k = 1; k < v.length; k++) expect(v[k]).toBeGreaterThan(v[k - 1]);
      expect(axis.domain[0]).toBeLessThanOrEqual(low * (1 + 1e-12));
      expect(axis.domain[1]).toBeGreaterThanOrEqual(high * (1 - 1e-12));
    }
  });
});

describe('date ticks', () => {
  it('names November 2026 once, not five times (hand-counted)', () => {
    // A month around four visits in November 2026: weekly ticks on Sundays.
    const axis = dateAxis(utc('2026-11-02'), utc('2026-11-30'), { count: 5 });
    expect(axis.unit).toBe('day');
    expect(labels(axis)).toEqual(['8 Nov 2026', '15 Nov', '22 Nov', '29 Nov']);
  });

  it('labels months with the year on the first tick and where it changes (hand-counted)', () => {
    const axis = dateAxis(utc('2025-10-04'), utc('2027-03-28'), { count: 5 });
    expect(axis.unit).toBe('month');
    expect(labels(axis)).toEqual(['Jan 2026', 'Apr', 'Jul', 'Oct', 'Jan 2027']);
    expect(new Date(values(axis)[0]).toISOString()).toBe('2026-01-01T00:00:00.000Z');
  });

  it('labels years as years (hand-counted)', () => {
    const axis = dateAxis(utc('2020-10-04'), utc('2027-03-28'), { count: 5 });
    expect(axis.unit).toBe('year');
    expect(labels(axis)).toEqual(['2021', '2022', '2023', '2024', '2025', '2026', '2027']);
  });

  it('names each year once and never repeats a date over seeded spans', () => {
    const random = seeded(99);
    for (let i = 0; i < 500; i++) {
      const start = utc('2024-01-01') + Math.floor(random() * 2000) * 86_400_000;
      const end = start + Math.floor(random() * 3000 + 20) * 86_400_000;
      const axis = dateAxis(start, end, { count: 2 + Math.floor(random() * 8) });
      const l = labels(axis);
      const v = values(axis);
      expect(l.length).toBeGreaterThan(0);
      // A label names its year on the first tick and where the year changes, nowhere else;
      // read with the last year named, every label is a different date.
      let year = '';
      const read = l.map((label, k) => {
        const named = /\b\d{4}$/.exec(label)?.[0];
        const tickYear = String(new Date(v[k]).getUTCFullYear());
        expect(named !== undefined).toBe(k === 0 || tickYear !== year);
        year = tickYear;
        return named === undefined ? `${label} ${year}` : label;
      });
      expect(new Set(read).size).toBe(read.length);
      for (let k = 1; k < v.length; k++) expect(v[k]).toBeGreaterThan(v[k - 1]);
      expect(v[0]).toBeGreaterThanOrEqual(start);
      expect(v[v.length - 1]).toBeLessThanOrEqual(end);
    }
  });
});

describe('tick label lookup', () => {
  it('answers a tick value with its label and other values at the fallback', () => {
    const axis = linearAxis(-1, 2, { count: 6, minDecimals: 1 });
    expect(tickLabelAt(axis, -1)).toBe(`${M}1.0`);
    expect(tickLabelAt(axis, 0.5 + 1e-15)).toBe('0.5');
    expect(tickLabelAt(axis, 0.25)).toBe('0.250');
  });
});
