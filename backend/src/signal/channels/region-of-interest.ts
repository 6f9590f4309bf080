import { normaliseChannelLabel } from '@gyre/shared/channel-labels';

/**
 * Default posterior region of interest for alpha (docs/method.md §1; 10-10 names
 * per ACNS Guideline 2, 2016).
 */
export const DEFAULT_POSTERIOR_ROI: readonly string[] = Object.freeze([
  'O1',
  'O2',
  'Oz',
  'POz',
  'PO3',
  'PO4',
  'PO7',
  'PO8',
  'Pz',
  'P3',
  'P4',
]);

export interface RoiChannel {
  /** Index into the label list that was searched. */
  index: number;
  /** Label as written in the file. */
  label: string;
  /** Canonical 10-10 name. */
  canonical: string;
}

/**
 * The channels of `labels` that belong to the region of interest, in file order.
 * When two labels name the same electrode (e.g. `O1-A1` and `O1-A2`) only the first
 * counts, so an electrode is never weighted twice.
 */
export function roiChannels(
  labels: readonly string[],
  roi: readonly string[] = DEFAULT_POSTERIOR_ROI,
): RoiChannel[] {
  const wanted = new Set<string>();
  for (const name of roi) {
    const canonical = normaliseChannelLabel(name);
    if (canonical) wanted.add(canonical);
  }
  const seen = new Set<string>();
  const found: RoiChannel[] = [];
  labels.forEach((label, index) => {
    const canonical = normaliseChannelLabel(label);
    if (canonical && wanted.has(canonical) && !seen.has(canonical)) {
      seen.add(canonical);
      found.push({ index, label, canonical });
    }
  });
  return found;
}

/** Indices into `labels` of the region-of-interest channels present (see `roiChannels`). */
export function roiChannelIndices(
  labels: readonly string[],
  roi: readonly string[] = DEFAULT_POSTERIOR_ROI,
): number[] {
  return roiChannels(labels, roi).map((c) => c.index);
}
