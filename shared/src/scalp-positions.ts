/**
 * Where each electrode of the 10-10 system sits on a scalp map: a point on a disc seen from
 * above, nose up, left hemisphere on the left. Plain data, no imports beyond the label rules,
 * so the client's review code and the visit report draw the same map.
 *
 * Source: R. Oostenveld and P. Praamstra (2001), "The five percent electrode system for
 * high-resolution EEG and ERP measurements", Clin. Neurophysiol. 112:713–719, which places the
 * 10-10 (and 10-5) positions on an idealised spherical head.
 *
 * How the numbers were made (computed, not copied from a table):
 * - On a unit sphere with Cz at the top, the nasion–inion arc through Cz is split in 10 %
 *   steps of 22.5° (Nz and Iz 22.5° below the Fpz–T7–Oz–T8 ring, Cz 90° above it), and so is
 *   the arc between the preauricular points through Cz (T9/T10 at their level). These are
 *   the system's definition.
 * - The ring through Fpz, T7, Oz and T8 is split in steps of 18° (5 % of the circumference):
 *   Fp1 18°, AF7 36°, F7 54°, FT7 72°, T7 90°, TP7 108°, P7 126°, PO7 144°, O1 162° from
 *   Fpz; the 9/10 columns (F9, FT9, T9, TP9, P9) sit at the same angles on the lower ring
 *   through Nz, T9 and Iz. The 9/10 columns' ring is from memory of the paper's figure.
 * - A row between (AF, F, FC, C, CP, P, PO) lies on the circle where the plane through its
 *   left ring point, its midline point and its right ring point cuts the sphere, split in
 *   eight equal arcs (X7, X5, X3, X1, Xz, X2, X4, X6, X8). That the paper builds its rows
 *   this way is from memory; the arithmetic is the definition above. As a check from memory,
 *   F3 lands 59.7° from Cz and 51.2° from the left–right axis, against the 60° and 51° of the
 *   common spherical montage files.
 *
 * Projection: azimuthal equidistant from Cz, so a point's distance from the centre is its
 * angle from Cz over 90°: Cz at 0, the Fpz–T7–Oz–T8 ring at radius 1, Nz, Iz and the 9/10
 * columns at 1.25; x grows to the right ear, y towards the nose. Rounded to 4 decimals.
 * The test (scalp-positions.spec.ts) checks these against the closed-form facts: the 10 %
 * steps, the ring angles, mirror pairs, and each row lifted back onto the sphere lying on one
 * plane in equal steps.
 */
import { canonicalElectrodeName } from './channel-labels';

/** A point on the scalp map's disc: [x to the right ear, y to the nose], ring at radius 1. */
export type ScalpPoint = readonly [x: number, y: number];

/** The 10-10 positions (ACNS 2016 names; T7/T8/P7/P8 for the old T3/T4/T5/T6). */
export const SCALP_POSITIONS_10_10: Readonly<Record<string, ScalpPoint>> = {
  Nz: [0, 1.25],
  Fp1: [-0.309, 0.9511],
  Fpz: [0, 1],
  Fp2: [0.309, 0.9511],
  AF7: [-0.5878, 0.809],
  AF3: [-0.3036, 0.7625],
  AFz: [0, 0.75],
  AF4: [0.3036, 0.7625],
  AF8: [0.5878, 0.809],
  F9: [-1.0113, 0.7347],
  F7: [-0.809, 0.5878],
  F5: [-0.617, 0.5424],
  F3: [-0.4152, 0.517],
  F1: [-0.2086, 0.504],
  Fz: [0, 0.5],
  F2: [0.2086, 0.504],
  F4: [0.4152, 0.517],
  F6: [0.617, 0.5424],
  F8: [0.809, 0.5878],
  F10: [1.0113, 0.7347],
  FT9: [-1.1888, 0.3863],
  FT7: [-0.9511, 0.309],
  FC5: [-0.7169, 0.2774],
  FC3: [-0.4793, 0.2607],
  FC1: [-0.24, 0.2525],
  FCz: [0, 0.25],
  FC2: [0.24, 0.2525],
  FC4: [0.4793, 0.2607],
  FC6: [0.7169, 0.2774],
  FT8: [0.9511, 0.309],
  FT10: [1.1888, 0.3863],
  T9: [-1.25, 0],
  T7: [-1, 0],
  C5: [-0.75, 0],
  C3: [-0.5, 0],
  C1: [-0.25, 0],
  Cz: [0, 0],
  C2: [0.25, 0],
  C4: [0.5, 0],
  C6: [0.75, 0],
  T8: [1, 0],
  T10: [1.25, 0],
  TP9: [-1.1888, -0.3863],
  TP7: [-0.9511, -0.309],
  CP5: [-0.7169, -0.2774],
  CP3: [-0.4793, -0.2607],
  CP1: [-0.24, -0.2525],
  CPz: [0, -0.25],
  CP2: [0.24, -0.2525],
  CP4: [0.4793, -0.2607],
  CP6: [0.7169, -0.2774],
  TP8: [0.9511, -0.309],
  TP10: [1.1888, -0.3863],
  P9: [-1.0113, -0.7347],
  P7: [-0.809, -0.5878],
  P5: [-0.617, -0.5424],
  P3: [-0.4152, -0.517],
  P1: [-0.2086, -0.504],
  Pz: [0, -0.5],
  P2: [0.2086, -0.504],
  P4: [0.4152, -0.517],
  P6: [0.617, -0.5424],
  P8: [0.809, -0.5878],
  P10: [1.0113, -0.7347],
  PO7: [-0.5878, -0.809],
  PO3: [-0.3036, -0.7625],
  POz: [0, -0.75],
  PO4: [0.3036, -0.7625],
  PO8: [0.5878, -0.809],
  O1: [-0.309, -0.9511],
  Oz: [0, -1],
  O2: [0.309, -0.9511],
  Iz: [0, -1.25],
};

/** Radius of the Fpz–T7–Oz–T8 ring, where a map draws the outline of the head. */
export const SCALP_RING_RADIUS = 1;

/** Radius of the outermost positions (Nz, Iz and the 9/10 columns). */
export const SCALP_OUTER_RADIUS = 1.25;

/**
 * The map position of an electrode name in any of the spellings the label rules accept
 * (`t3` → T7's, `POZ` → POz's); null for a name outside the 10-10 positions above.
 */
export function scalpPositionOf(name: string): ScalpPoint | null {
  const canonical = canonicalElectrodeName(name);
  return canonical === null ? null : (SCALP_POSITIONS_10_10[canonical] ?? null);
}
