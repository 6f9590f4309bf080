import { type LabelBox, labelBox, placeLabels, scalpEarBoxes } from './scalp-label-placement';
import { SCALP_POSITIONS_10_10 } from './scalp-positions';

// Geometry by hand (closed form): dots of radius 7, names 9 units high.
const DOT = 7;
const SIZE = 9;

describe('placing the scalp map names', () => {
  it('puts a lone name below its dot, centred', () => {
    const [placed] = placeLabels([{ name: 'Cz', centre: [0, 0] }], DOT, SIZE);
    expect(placed).toMatchObject({ side: 'below', dx: 0, anchor: 'middle' });
    const box = labelBox([0, 0], 'Cz', placed, SIZE);
    // Below the dot's bottom edge, symmetric about its centre.
    expect(box.y0).toBeGreaterThanOrEqual(DOT);
    expect(box.x0).toBeCloseTo(-box.x1, 10);
  });

  it('moves a name above when a dot sits right under it, and off an ear', () => {
    const [upper] = placeLabels(
      [
        { name: 'PO3', centre: [0, 0] },
        { name: 'O1', centre: [0, 20] },
      ],
      DOT,
      SIZE,
    );
    expect(upper.side).toBe('above');
    const ear = { x0: -4, y0: -16, x1: 4, y1: 16 };
    const [t7] = placeLabels([{ name: 'T7', centre: [0, 0] }], DOT, SIZE, [ear]);
    expect(t7.side).toBe('right');
  });

  it('never lets two names cover each other when there is room', () => {
    const dots = [
      { name: 'P3', centre: [0, 0] as const },
      { name: 'Pz', centre: [18, 0] as const },
    ];
    const placed = placeLabels(dots, DOT, SIZE);
    const [a, b] = placed.map((p, i) => labelBox(dots[i].centre, dots[i].name, p, SIZE));
    expect(a.x1 <= b.x0 || b.x1 <= a.x0 || a.y1 <= b.y0 || b.y1 <= a.y0).toBe(true);
  });

  it('places by the measured width when one is given', () => {
    // Estimated (2 × 9 × 0.62 ≈ 11.2 wide) the two names fit below; 30 wide they would meet.
    const dots = [
      { name: 'P3', centre: [0, 0] as const },
      { name: 'Pz', centre: [18, 0] as const },
    ];
    expect(placeLabels(dots, DOT, SIZE).map((p) => p.side)).toEqual(['below', 'below']);
    const measured = placeLabels(dots, DOT, SIZE, [], () => 30);
    expect(measured.map((p) => p.side)).toEqual(['below', 'above']);
    expect(labelBox([0, 0], 'P3', measured[0], SIZE, 30).x1).toBe(15);
  });

  it('boxes the ears either side of the head, mirrored', () => {
    // A head of radius 100: ears centred at ±104, 4.5 either side, 16 above and below.
    const [left, right] = scalpEarBoxes(100);
    expect(left).toEqual({ x0: -108.5, y0: -16, x1: -99.5, y1: 16 });
    expect(right.x0).toBeCloseTo(99.5, 10);
    expect(right.x1).toBeCloseTo(108.5, 10);
  });

  // Review's proportions (ring radius 100, dots 7, names 9; the PDF keeps them at 72 pt).
  const layout = (names: readonly string[]) => {
    const dots = names.map((name) => {
      const [x, y] = SCALP_POSITIONS_10_10[name];
      return { name, centre: [x * 100, -y * 100] as const };
    });
    const ears = scalpEarBoxes(100);
    const boxes = placeLabels(dots, DOT, SIZE, ears).map((p, i) =>
      labelBox(dots[i].centre, dots[i].name, p, SIZE),
    );
    return { dots, ears, boxes };
  };
  const apart = (a: LabelBox, b: LabelBox) =>
    a.x1 <= b.x0 || b.x1 <= a.x0 || a.y1 <= b.y0 || b.y1 <= a.y0;
  const clearOf = (box: LabelBox, [x, y]: readonly [number, number]) =>
    (Math.min(Math.max(x, box.x0), box.x1) - x) ** 2 +
      (Math.min(Math.max(y, box.y0), box.y1) - y) ** 2 >=
    DOT ** 2;

  // The 19 electrodes of the 10-20 system in their 10-10 names (ACNS 2016, from memory).
  const TEN_TWENTY = 'Fp1 Fp2 F7 F3 Fz F4 F8 T7 C3 Cz C4 T8 P7 P3 Pz P4 P8 O1 O2'.split(' ');

  it('names all 73 positions of a full 10-10 map with no two names over each other', () => {
    const { boxes } = layout(Object.keys(SCALP_POSITIONS_10_10));
    expect(boxes).toHaveLength(73);
    for (const [i, box] of boxes.entries()) {
      for (const other of boxes.slice(i + 1)) expect(apart(box, other)).toBe(true);
    }
  });

  it('keeps every name of a 10-20 montage off the other dots, the names and the ears', () => {
    const { dots, ears, boxes } = layout(TEN_TWENTY);
    for (const [i, box] of boxes.entries()) {
      for (const other of [...boxes.slice(i + 1), ...ears]) expect(apart(box, other)).toBe(true);
      for (const [j, other] of dots.entries())
        if (j !== i) expect(clearOf(box, other.centre)).toBe(true);
    }
  });
});
