import { SCALP_POSITIONS_10_10, scalpPositionOf, type ScalpPoint } from './scalp-positions';

const DEG = Math.PI / 180;
/** Rounding of the stored positions (4 decimals) plus a little. */
const CLOSE = 4;

function at(name: string): ScalpPoint {
  const point = SCALP_POSITIONS_10_10[name];
  if (point === undefined) throw new Error(`no position for ${name}`);
  return point;
}

/** Back from the disc onto the unit sphere: radius 1 ↔ 90° from Cz (azimuthal equidistant). */
function onSphere([x, y]: ScalpPoint): [number, number, number] {
  const r = Math.hypot(x, y);
  if (r === 0) return [0, 0, 1];
  const theta = (r * Math.PI) / 2;
  return [(Math.sin(theta) * x) / r, (Math.sin(theta) * y) / r, Math.cos(theta)];
}

const sub = (a: number[], b: number[]) => a.map((v, i) => v - b[i]);
const dot = (a: number[], b: number[]) => a.reduce((s, v, i) => s + v * b[i], 0);
const cross = (a: number[], b: number[]) => [
  a[1] * b[2] - a[2] * b[1],
  a[2] * b[0] - a[0] * b[2],
  a[0] * b[1] - a[1] * b[0],
];

describe('10-10 scalp positions (Oostenveld & Praamstra 2001, spherical head)', () => {
  it('names the 73 positions of the ACNS 10-10 figure (ACNS 2016, Guideline 2, from memory)', () => {
    expect(Object.keys(SCALP_POSITIONS_10_10)).toHaveLength(73);
    for (const name of ['T7', 'T8', 'P7', 'P8', 'Nz', 'Iz', 'FT9', 'TP10', 'AFz', 'POz']) {
      expect(SCALP_POSITIONS_10_10[name]).toBeDefined();
    }
    for (const old of ['T3', 'T4', 'T5', 'T6']) expect(SCALP_POSITIONS_10_10[old]).toBeUndefined();
  });

  it('puts Cz at the centre and Fpz, T8, Oz, T7 on the axes at radius 1 (the projection)', () => {
    expect(at('Cz')).toEqual([0, 0]);
    expect(at('Fpz')).toEqual([0, 1]);
    expect(at('Oz')).toEqual([0, -1]);
    expect(at('T7')).toEqual([-1, 0]);
    expect(at('T8')).toEqual([1, 0]);
  });

  it('steps 0.25 per 10 % along the midline and the coronal arc (40 % = 90° from Cz to the ring)', () => {
    const midline = ['Nz', 'Fpz', 'AFz', 'Fz', 'FCz', 'Cz', 'CPz', 'Pz', 'POz', 'Oz', 'Iz'];
    midline.forEach((name, i) => {
      expect(at(name)[0]).toBe(0);
      expect(at(name)[1]).toBeCloseTo(1.25 - 0.25 * i, CLOSE);
    });
    const coronal = ['T9', 'T7', 'C5', 'C3', 'C1', 'Cz', 'C2', 'C4', 'C6', 'T8', 'T10'];
    coronal.forEach((name, i) => {
      expect(at(name)[0]).toBeCloseTo(-1.25 + 0.25 * i, CLOSE);
      expect(at(name)[1]).toBe(0);
    });
  });

  it('places the ring in 5 % (18°) steps from Fpz, and the 9/10 columns at 1.25 at the same angles', () => {
    const ring = ['Fpz', 'Fp1', 'AF7', 'F7', 'FT7', 'T7', 'TP7', 'P7', 'PO7', 'O1', 'Oz'];
    ring.forEach((name, i) => {
      // Left of the nose: x = −sin(18° i), y = cos(18° i) (closed form on the unit circle).
      expect(at(name)[0]).toBeCloseTo(-Math.sin(18 * i * DEG), CLOSE);
      expect(at(name)[1]).toBeCloseTo(Math.cos(18 * i * DEG), CLOSE);
    });
    const lower: Array<[string, number]> = [
      ['F9', 54],
      ['FT9', 72],
      ['T9', 90],
      ['TP9', 108],
      ['P9', 126],
    ];
    for (const [name, degrees] of lower) {
      expect(at(name)[0]).toBeCloseTo(-1.25 * Math.sin(degrees * DEG), CLOSE);
      expect(at(name)[1]).toBeCloseTo(1.25 * Math.cos(degrees * DEG), CLOSE);
    }
  });

  it('mirrors every odd (left) electrode in its even (right) partner', () => {
    const names = Object.keys(SCALP_POSITIONS_10_10);
    let pairs = 0;
    for (const name of names) {
      const m = /^([A-Za-z]+)(\d+)$/.exec(name);
      if (m === null) {
        expect(at(name)[0]).toBe(0); // z electrodes sit on the midline
        continue;
      }
      const n = Number(m[2]);
      if (n % 2 === 0) continue;
      const partner = at(`${m[1]}${n + 1}`);
      expect(at(name)[0]).toBeLessThan(0);
      expect(partner[0]).toBeCloseTo(-at(name)[0], 10);
      expect(partner[1]).toBeCloseTo(at(name)[1], 10);
      pairs += 1;
    }
    expect(pairs).toBe(31); // 73 positions, 11 of them on the midline
  });

  it.each(['AF', 'F', 'FC', 'C', 'CP', 'P', 'PO'])(
    'lays the %s row on one plane through the sphere in equal steps (equal arcs ↔ equal chords)',
    (row) => {
      const ringName = { AF: 'AF', F: 'F', FC: 'FT', C: 'T', CP: 'TP', P: 'P', PO: 'PO' }[row];
      const names = [`${ringName}7`, `${row}5`, `${row}3`, `${row}1`, `${row}z`];
      // The 10-10 AF and PO rows name only X7, X3, Xz: X5 and X1 are 10-5 positions.
      const present = names.filter((n) => SCALP_POSITIONS_10_10[n] !== undefined);
      const points = present.map((n) => onSphere(at(n)));
      const mirror = onSphere(at(`${ringName}8`));
      const normal = cross(sub(points[points.length - 1], points[0]), sub(mirror, points[0]));
      for (const p of points) {
        expect(dot(normal, sub(p, points[0])) / Math.hypot(...normal)).toBeCloseTo(0, 3);
      }
      const chords = points.slice(1).map((p, i) => Math.hypot(...sub(p, points[i])));
      for (const chord of chords) expect(chord).toBeCloseTo(chords[0], 3);
      // Every point on the unit sphere is back at radius 1 (the lifting is exact).
      for (const p of points) expect(Math.hypot(...p)).toBeCloseTo(1, 10);
    },
  );

  it('finds a position by any spelling the label rules accept, old 10-20 names included', () => {
    expect(scalpPositionOf('T3')).toEqual(at('T7'));
    expect(scalpPositionOf('t6')).toEqual(at('P8'));
    expect(scalpPositionOf('POZ')).toEqual(at('POz'));
    expect(scalpPositionOf('fp1')).toEqual(at('Fp1'));
    expect(scalpPositionOf('A1')).toBeNull();
    expect(scalpPositionOf('AF1')).toBeNull();
    expect(scalpPositionOf('ECG')).toBeNull();
  });
});
