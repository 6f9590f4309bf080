import { describe, expect, it } from 'vitest';
import { labelBox, placeLabels } from './scalp-label-placement';

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
});
