import type { RunDepthSettings, RunTrigger } from '@gyre/shared';
import { formatHz, formatNumber } from '../../../lib/format';

/** What started a run, after "Computed …". */
export const TRIGGER_WORDS: Record<RunTrigger, string> = {
  upload: 'once the file was accepted',
  rerun: "on an analyst's re-run",
  retry: 'on a retry after a failure',
  'rest-changed': "automatically, because the visit's resting IAF arrived or changed",
  override: "after this visit's own analysis choices changed",
  replacement: 'after the recording was replaced',
};

/** Said wherever a `rest-changed` run's numbers are shown. */
export const REST_CHANGED_NOTICE =
  "Recomputed automatically because the visit's resting IAF arrived or changed: the band follows the resting IAF ± 2 Hz.";

/**
 * The analysis-depth settings a task run was computed with, for the provenance line:
 * "amplitude gate off; cross-check warning above 0.10 Hz; conditions compared: the first two found".
 */
export function depthSettingsWords(settings: RunDepthSettings): string {
  const gate =
    settings.amplitudeGatePercentile === null
      ? 'amplitude gate off'
      : `amplitude gate at percentile ${formatNumber(settings.amplitudeGatePercentile, 0)} of each channel's envelope`;
  const pair = settings.compareConditions;
  const compared = pair === null ? 'the first two found' : `“${pair[0]}” − “${pair[1]}”`;
  return `${gate}; cross-check warning above ${formatHz(settings.cycleDisagreementHz)}; conditions compared: ${compared}`;
}
