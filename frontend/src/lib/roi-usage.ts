import type { RoiChannelOmission, RoiOmissionReason, RoiUsageView } from '@gyre/shared';

/** Said, in these words, wherever a number would need a region-of-interest channel. */
export const NO_ROI_CHANNEL_REMAINS = 'No region-of-interest channel remains';

const OMISSION_WORDS: Record<RoiOmissionReason, string> = {
  missing: 'not in the file',
  flat: 'flat',
  saturated: "saturated: held at the converter's limit",
  'sample-rate': 'another sampling rate',
  excluded: "left out by this visit's override",
};

export function omissionWords(reason: RoiOmissionReason): string {
  return OMISSION_WORDS[reason];
}

/** `O2 (flat), P3 (not in the file)`. */
export function leftOutText(leftOut: RoiChannelOmission[]): string {
  return leftOut.map((o) => `${o.label} (${omissionWords(o.reason)})`).join(', ');
}

/**
 * The region-of-interest usage in one sentence; null when every wanted channel was used
 * (nothing to say).
 */
export function roiUsageSentence(usage: RoiUsageView): string | null {
  if (usage.status === 'complete') return null;
  if (usage.status === 'none') {
    return usage.leftOut.length === 0
      ? `${NO_ROI_CHANNEL_REMAINS}: the region names no channel.`
      : `${NO_ROI_CHANNEL_REMAINS}: ${leftOutText(usage.leftOut)}.`;
  }
  return `Region of interest from ${usage.used.join(', ')} only; left out ${leftOutText(usage.leftOut)}.`;
}

/** Whether a channel (by its file label or its 10-10 name) is one the run averaged. */
export function usedInRoi(usage: RoiUsageView, label: string, canonical: string | null): boolean {
  const used = new Set(usage.used.map((name) => name.toLowerCase()));
  return used.has(label.toLowerCase()) || (canonical !== null && used.has(canonical.toLowerCase()));
}

/** The omission of a channel (by file label or 10-10 name), if the run left it out. */
export function omissionOf(
  usage: RoiUsageView,
  label: string,
  canonical: string | null,
): RoiChannelOmission | null {
  const names = [label, canonical]
    .filter((n): n is string => n !== null)
    .map((n) => n.toLowerCase());
  return usage.leftOut.find((o) => names.includes(o.label.toLowerCase())) ?? null;
}
