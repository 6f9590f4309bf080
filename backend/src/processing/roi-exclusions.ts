import type { RoiUsageView } from '@gyre/shared';
import { canonicalElectrodeName } from '@gyre/shared/channel-labels';

/**
 * The signal core only knows the region of interest it was given. Channels the study's region
 * has but the visit's override took out are named too ('excluded'), so every surface can say
 * that the number rests on fewer channels than the study asks for, and why.
 */
export function withExclusions(
  usage: RoiUsageView,
  studyRoi: readonly string[],
  effectiveRoi: readonly string[],
): { usage: RoiUsageView; warnings: string[] } {
  const canonical = (name: string): string => canonicalElectrodeName(name) ?? name;
  const kept = new Set(effectiveRoi.map(canonical));
  const excluded = studyRoi.filter((name) => !kept.has(canonical(name)));
  if (excluded.length === 0) return { usage, warnings: [] };
  const leftOut = [
    ...usage.leftOut,
    ...excluded.map((label) => ({ label, reason: 'excluded' as const })),
  ];
  return {
    usage: {
      wanted: [...usage.wanted, ...excluded],
      used: usage.used,
      leftOut,
      status: usage.used.length === 0 ? 'none' : 'partial',
    },
    warnings: [
      `${excluded.join(', ')} left out of the region of interest by the visit's analysis choices.`,
    ],
  };
}
