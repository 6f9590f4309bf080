import type { RoiChannelOmission } from '@gyre/shared';
import { DEFAULT_POSTERIOR_ROI, normaliseChannelLabel, roiChannels } from '../channels';
import type { RoiUsage } from './analysis.types';

/** What the quality checks found about one analysed channel. */
export interface RoiChannelFacts {
  label: string;
  sampleRateHz: number;
  flat: boolean;
  saturated: boolean;
}

export interface RoiDecision {
  usage: RoiUsage;
  /** Indices into the analysed channels of those the region-of-interest result averages. */
  used: ReadonlySet<number>;
  /** File labels of the region's channels present in the file, used or not, in file order. */
  found: string[];
  /** The one sampling rate of the channels used; null when none is used. */
  sampleRateHz: number | null;
  /** Plain-words warnings naming each channel left out and why. */
  warnings: string[];
}

/**
 * Which channels of the region of interest a result may average: present (first label per
 * electrode), not flat, not saturated, and at the sampling rate most usable region channels
 * share (the first such rate in file order on a tie), as averaging needs one time grid.
 * Every wanted name not used is listed with its reason; nothing falls back to other channels.
 */
export function decideRoiUsage(
  wanted: readonly string[],
  channels: readonly RoiChannelFacts[],
): RoiDecision {
  const found = roiChannels(
    channels.map((c) => c.label),
    wanted,
  );
  const usable = found.filter((r) => !channels[r.index].flat && !channels[r.index].saturated);
  const perRate = new Map<number, number>();
  for (const r of usable) {
    const rate = channels[r.index].sampleRateHz;
    perRate.set(rate, (perRate.get(rate) ?? 0) + 1);
  }
  let sampleRateHz: number | null = null;
  let most = 0;
  for (const [rate, count] of perRate) {
    if (count > most) {
      sampleRateHz = rate;
      most = count;
    }
  }
  const byCanonical = new Map(found.map((r) => [r.canonical, r]));
  const leftOut: RoiChannelOmission[] = [];
  const details: string[] = [];
  const seen = new Set<string>();
  for (const name of wanted) {
    const canonical = normaliseChannelLabel(name) ?? name.trim();
    if (seen.has(canonical)) continue;
    seen.add(canonical);
    const present = byCanonical.get(canonical);
    if (!present) {
      leftOut.push({ label: name, reason: 'missing' });
      details.push(`${name} (not in the file)`);
      continue;
    }
    const facts = channels[present.index];
    if (facts.flat) {
      leftOut.push({ label: present.label, reason: 'flat' });
      details.push(`${present.label} (flat)`);
    } else if (facts.saturated) {
      leftOut.push({ label: present.label, reason: 'saturated' });
      details.push(`${present.label} (saturated: held at the converter's limit)`);
    } else if (facts.sampleRateHz !== sampleRateHz) {
      leftOut.push({ label: present.label, reason: 'sample-rate' });
      details.push(
        `${present.label} (sampled at ${facts.sampleRateHz} Hz, the region at ${sampleRateHz} Hz)`,
      );
    }
  }
  const usedChannels = usable.filter((r) => channels[r.index].sampleRateHz === sampleRateHz);
  // The default posterior set means "those present" (docs/method.md §1): a name of it that
  // the montage lacks is listed, but is no doubt about the number. A study's own region
  // names every channel it wants, so there a missing one is.
  const missingExpected = sameNames(wanted, DEFAULT_POSTERIOR_ROI);
  const doubtful = leftOut.filter((o) => o.reason !== 'missing' || !missingExpected);
  const status: RoiUsage['status'] =
    usedChannels.length === 0 ? 'none' : doubtful.length === 0 ? 'complete' : 'partial';
  const doubtfulDetails = details.filter((_d, i) => doubtful.includes(leftOut[i]));
  const warnings: string[] = [];
  if (status === 'none') {
    const why = details.length > 0 ? `: ${details.join('; ')}` : ': the region names no channel';
    warnings.push(
      `No region-of-interest channel remains${why}. There is no region-of-interest result.`,
    );
  } else if (status === 'partial') {
    warnings.push(`Region-of-interest channels left out: ${doubtfulDetails.join('; ')}.`);
  }
  return {
    usage: {
      wanted: [...wanted],
      used: usedChannels.map((r) => r.label),
      leftOut,
      status,
    },
    used: new Set(usedChannels.map((r) => r.index)),
    found: found.map((r) => r.label),
    sampleRateHz: usedChannels.length > 0 ? sampleRateHz : null,
    warnings,
  };
}

function sameNames(a: readonly string[], b: readonly string[]): boolean {
  const canonical = (names: readonly string[]): string =>
    [...new Set(names.map((n) => normaliseChannelLabel(n) ?? n.trim()))].sort().join(',');
  return canonical(a) === canonical(b);
}
