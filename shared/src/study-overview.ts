/**
 * The study overview (GET /api/studies/:studyId/overview): each participant's course over the
 * planned visits with the group mean and its 95 % confidence interval per planned visit (by
 * group and by site), the completion matrix, and the site quality comparison.
 */

/** The three measures of the overview: resting PAF and CoG, and the task's ROI onset Δf. */
export const OVERVIEW_MEASURES = ['paf', 'cog', 'deltaF'] as const;
export type OverviewMeasure = (typeof OVERVIEW_MEASURES)[number];

/**
 * A participant's state at one planned visit, most advanced first in this order:
 * `missing` no visit registered on the planned visit; `uploaded` a current recording but no
 * results yet; `computed` results (a current run); `reviewed` an analyst's review covers
 * exactly the current runs; `signed` a signed (or sent) report with no run newer than its
 * newest signature.
 */
export const COMPLETION_STATES = ['missing', 'uploaded', 'computed', 'reviewed', 'signed'] as const;
export type CompletionState = (typeof COMPLETION_STATES)[number];

export interface OverviewPlannedVisit {
  id: string;
  name: string;
  targetDay: number;
}

/** One participant's values and state at one planned visit. */
export interface OverviewCell {
  plannedVisitId: string;
  /** The visit counted here (the latest-dated one when several sit on the planned visit). */
  visitId: string | null;
  visitDate: string | null;
  state: CompletionState;
  /**
   * A signed report exists but a run is newer than its newest signature: the state falls
   * back to `reviewed` or `computed` and this says the signature no longer covers the numbers.
   */
  changedSinceSigning: boolean;
  paf: number | null;
  cog: number | null;
  deltaF: number | null;
  /** Why this cell's numbers may be doubtful, in words (empty when nothing is in doubt). */
  doubts: string[];
}

export interface OverviewParticipant {
  id: string;
  code: string;
  siteId: string;
  groupId: string | null;
  cells: OverviewCell[];
  /** Visits of this participant on no planned visit (not in the overview's numbers). */
  unplannedVisits: number;
}

/**
 * n, mean and the 95 % confidence interval of the mean (Student t with n − 1 degrees of
 * freedom: mean ± t₀.₉₇₅,ₙ₋₁ · s / √n) of one measure at one planned visit in one group or
 * site. `ciLow`/`ciHigh` are null below two values; `mean` is null without any.
 */
export interface OverviewStat {
  measure: OverviewMeasure;
  plannedVisitId: string;
  /** The group or site id; null for participants with no group (when by group). */
  key: string | null;
  n: number;
  mean: number | null;
  sd: number | null;
  ciLow: number | null;
  ciHigh: number | null;
  /** Of the n values, how many carry a doubt (see OverviewCell.doubts). */
  doubtful: number;
}

/** Per site: what monitors compare. Shares are 0–1; null when the site has nothing to measure. */
export interface SiteQuality {
  siteId: string;
  siteName: string;
  /** Every recording ever uploaded at the site, superseded ones included. */
  uploads: number;
  rejected: number;
  /** rejected / uploads. */
  rejectionRate: number | null;
  /** Current runs behind the means below. */
  runs: number;
  /** Mean over task runs of the share of epochs dropped. */
  epochsDroppedShare: number | null;
  /** Mean over runs of the median 50 Hz line-noise ratio over channels. */
  lineNoiseRatio50Hz: number | null;
  /** Mean over runs of the median 60 Hz line-noise ratio over channels. */
  lineNoiseRatio60Hz: number | null;
  /** Mean over task runs of the share of samples with a phase slip. */
  phaseSlipShare: number | null;
  /** Mean over runs of the region-of-interest channels wanted but not used. */
  roiChannelsLost: number | null;
  /** Runs whose region of interest kept no channel at all. */
  runsWithoutRoi: number;
}

export interface StudyOverviewView {
  studyId: string;
  plannedVisits: OverviewPlannedVisit[];
  groups: Array<{ id: string; name: string }>;
  sites: Array<{ id: string; name: string }>;
  participants: OverviewParticipant[];
  byGroup: OverviewStat[];
  bySite: OverviewStat[];
  siteQuality: SiteQuality[];
  /** Study-wide cautions about the numbers, in words. */
  notes: string[];
}
