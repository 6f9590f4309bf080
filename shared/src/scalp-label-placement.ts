/**
 * Where each channel's name goes beside its dot on the scalp map (Review's SVG and the visit
 * report's PDF): below the dot unless that would cover another dot, an ear or a name already
 * placed; then above, right or left. A greedy pass in the channels' order: hand-written
 * because no installed package places labels, and 64 dots need nothing cleverer. Units are
 * the drawing's own (SVG units or PDF points), y pointing down.
 */

export type LabelSide = 'below' | 'above' | 'right' | 'left';

export interface LabelBox {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export interface PlacedLabel {
  side: LabelSide;
  /** The text's anchor point on its baseline, relative to the dot's centre (y down). */
  dx: number;
  dy: number;
  anchor: 'middle' | 'start' | 'end';
}

const SIDES: readonly LabelSide[] = ['below', 'above', 'right', 'left'];
/** Average advance of a digit or capital in IBM Plex Sans, per unit of font size (approx.). */
const CHAR_WIDTH = 0.62;

function offsetOf(side: LabelSide, dot: number, size: number): PlacedLabel {
  const gap = 1.5;
  switch (side) {
    case 'below':
      return { side, dx: 0, dy: dot + gap + size * 0.8, anchor: 'middle' };
    case 'above':
      return { side, dx: 0, dy: -dot - gap, anchor: 'middle' };
    case 'right':
      return { side, dx: dot + gap, dy: size * 0.3, anchor: 'start' };
    case 'left':
      return { side, dx: -dot - gap, dy: size * 0.3, anchor: 'end' };
  }
}

/** The box a label's text covers, in the map's coordinates; `width` measured, or estimated. */
export function labelBox(
  centre: readonly [number, number],
  text: string,
  placed: PlacedLabel,
  size: number,
  width = text.length * size * CHAR_WIDTH,
): LabelBox {
  const x = centre[0] + placed.dx;
  const baseline = centre[1] + placed.dy;
  const x0 = placed.anchor === 'middle' ? x - width / 2 : placed.anchor === 'start' ? x : x - width;
  return { x0, y0: baseline - size * 0.75, x1: x0 + width, y1: baseline + size * 0.05 };
}

function overlaps(a: LabelBox, b: LabelBox): boolean {
  return a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
}

function coversCircle(box: LabelBox, centre: readonly [number, number], radius: number): boolean {
  const nearestX = Math.min(Math.max(centre[0], box.x0), box.x1);
  const nearestY = Math.min(Math.max(centre[1], box.y0), box.y1);
  return (nearestX - centre[0]) ** 2 + (nearestY - centre[1]) ** 2 < radius ** 2;
}

/**
 * The two ears of a head outline of radius `head` centred on 0, as both maps draw them
 * (ellipses at ±1.04 r, 0.045 r wide and 0.16 r high each side of their centre): boxes no
 * name may cover.
 */
export function scalpEarBoxes(head: number): LabelBox[] {
  return [-1, 1].map((side) => ({
    x0: side * 1.04 * head - 0.045 * head,
    y0: -0.16 * head,
    x1: side * 1.04 * head + 0.045 * head,
    y1: 0.16 * head,
  }));
}

/**
 * One placement per dot, in order. `dots` are the names and their dots' centres (y down),
 * `obstacles` boxes no label may cover (the ears), `textWidth` a name's measured width where
 * the font's metrics are at hand (the PDF); without it the width is estimated. When every side
 * collides, the side that covers the fewest things wins.
 */
export function placeLabels(
  dots: ReadonlyArray<{ name: string; centre: readonly [number, number] }>,
  dot: number,
  size: number,
  obstacles: readonly LabelBox[] = [],
  textWidth?: (text: string) => number,
): PlacedLabel[] {
  const taken: LabelBox[] = [...obstacles];
  return dots.map((current, index) => {
    let best: { placed: PlacedLabel; box: LabelBox; hits: number } | null = null;
    const width = textWidth?.(current.name);
    for (const side of SIDES) {
      const placed = offsetOf(side, dot, size);
      const box = labelBox(current.centre, current.name, placed, size, width);
      const hits =
        dots.filter((other, j) => j !== index && coversCircle(box, other.centre, dot)).length +
        taken.filter((other) => overlaps(box, other)).length;
      if (best === null || hits < best.hits) best = { placed, box, hits };
      if (hits === 0) break;
    }
    const chosen = best as { placed: PlacedLabel; box: LabelBox };
    taken.push(chosen.box);
    return chosen.placed;
  });
}
