import type { RunTrigger } from '@gyre/shared';

/** What started a run, after "Computed …". */
export const TRIGGER_WORDS: Record<RunTrigger, string> = {
  upload: 'after upload',
  rerun: "on an analyst's re-run",
  retry: 'on a retry after a failure',
  'rest-changed': "automatically, because the visit's resting IAF arrived or changed",
  override: "after this visit's own analysis choices changed",
  replacement: 'after the recording was replaced',
};

/** Said wherever a `rest-changed` run's numbers are shown. */
export const REST_CHANGED_NOTICE =
  "Recomputed automatically because the visit's resting IAF arrived or changed: the band follows the resting IAF ± 2 Hz.";
