import type {
  ConditionDifferenceView,
  ConditionStatsView,
  CycleEstimateView,
  QualityView,
  RoiUsageView,
  RunDepthSettings,
  ScalpChannelValues,
} from '@gyre/shared';

/**
 * Everything a visit report prints, as plain data: no entities, no I/O. The service that
 * signs reports builds one of these from the database; the renderer only draws it.
 */
export interface VisitReportModel {
  reportId: string;
  /** 1 for the first report of the visit; each new revision after a signature adds one. */
  revision: number;
  /** When this document was generated, ISO 8601 (printed in UTC). */
  generatedAtIso: string;
  study: { name: string; code: string | null };
  site: { name: string };
  /** The pseudonymous participant code (never a name). */
  participantCode: string;
  visit: { label: string; /** YYYY-MM-DD */ date: string };
  rest: RestSection | null;
  task: TaskSection | null;
  /** One entry per recording that was analysed. */
  quality: QualitySection[];
  /** Flags of the visit, current first; empty when none was ever raised. */
  flags: FlagEntry[];
  /** What the computation suggested for the flag (never acting alone); null when no task section. */
  flagSuggestion: FlagSuggestionEntry | null;
  /** One entry per analysis run the report rests on. */
  provenance: ProvenanceEntry[];
  /** The earlier signed revision this one replaces, if any. */
  supersedes: { revision: number; sha256: string } | null;
  /** Present once signed; a draft has none and says so on every page. */
  signature: SignatureEntry | null;
}

/** The recording a section's numbers come from (a visit may also hold superseded ones). */
export interface RecordingSource {
  recordingId: string;
  uploadedAtIso: string;
  /** The earlier recording of the same kind this one replaced, if any. */
  replacesId: string | null;
  /** Why it was replaced, as entered at upload; null when none was recorded. */
  replacementReason: string | null;
}

/**
 * A resting recording's result. With `roiUsage.status === 'none'` the recording was analysed
 * but no region-of-interest channel remained: PAF, CoG and prominence are then null and the
 * spectrum is not drawn (a section that is absent altogether means no resting recording).
 */
export interface RestSection {
  /** Null = no clear peak (docs/method.md §4: no forced answer), or no ROI channel left. */
  pafHz: number | null;
  cogHz: number | null;
  /** Peak height over the 1/f background, dB; null without a clear peak. */
  prominenceDb: number | null;
  /** Why no PAF was reported (e.g. `below-prominence`), else null. */
  noPeakReason: string | null;
  alphaWindowHz: [number, number];
  /** ROI spectrum; may be empty when no ROI channel remains. */
  spectrum: { frequencyHz: number[]; powerUv2PerHz: number[] };
  /** Frequencies drawn on the spectrum plot; default [1, 30] Hz. */
  displayRangeHz?: [number, number];
  /** Which region-of-interest channels the numbers rest on. */
  roiUsage: RoiUsageView;
  source: RecordingSource;
  /** Each channel's own PAF and CoG for the scalp maps; absent when no channel has one. */
  scalpMap?: ScalpMapChannels;
}

/** The per-channel numbers a section's scalp map draws (report-scalp-map.ts). */
export interface ScalpMapChannels {
  channels: ScalpChannelValues[];
  /** File labels the quality checks found flat or saturated (drawn as left out). */
  flatChannels: string[];
  saturatedChannels: string[];
}

/**
 * A task recording's result. With `roiUsage.status === 'none'` no region-of-interest channel
 * remained: Δf, its CI and p are null and the onset curve is not drawn (may be empty).
 */
export interface TaskSection {
  /** ROI Δf = post − baseline, Hz; negative = slowing. */
  deltaFHz: number | null;
  ciHz: [number, number] | null;
  /** Wilcoxon signed-rank test over trials. */
  pValue: number | null;
  trialsKept: number | null;
  trialsTotal: number | null;
  /** Dropped epochs by reason, e.g. { amplitude: 3, edge: 1 }. */
  droppedByReason: Record<string, number>;
  bandHz: [number, number];
  baselineWindowS: [number, number];
  postWindowS: [number, number];
  onsetCurve: {
    timeS: number[];
    meanHz: Array<number | null>;
    ciLowHz: Array<number | null>;
    ciHighHz: Array<number | null>;
  };
  /** Which region-of-interest channels the numbers rest on. */
  roiUsage: RoiUsageView;
  source: RecordingSource;
  /** Each channel's own Δf for the scalp map; absent for runs without `depth` (see there). */
  scalpMap?: ScalpMapChannels;
  /**
   * Conditions, the cycle-by-cycle cross-check and the amplitude gate; absent when the run
   * computed none of them (so reports of earlier runs state, and fingerprint, what they did).
   */
  depth?: TaskDepthSection;
}

/** What a task run adds beyond the region of interest's Δf. */
export interface TaskDepthSection {
  /** Δf per condition (onset label) in the region of interest; empty without labels. */
  conditions: ConditionStatsView[];
  /** Δf(first) − Δf(second); null with fewer than two conditions. */
  conditionDifference: ConditionDifferenceView | null;
  /** The cycle-by-cycle estimate beside the phase-based one; null when not computed. */
  cycles: CycleEstimateView | null;
  /** The run's threshold above which the two estimates disagree, Hz. */
  cycleDisagreementHz: number;
  /** Samples the amplitude gate left out over the region's channels; null with the gate off. */
  amplitudeGate: {
    percentile: number;
    excludedSamples: number;
    totalSamples: number;
  } | null;
}

/** Quality checks of one recording (docs/method.md §6), as the analysis reported them. */
export interface QualitySection extends Omit<QualityView, 'channels'> {
  kind: 'resting' | 'task';
}

export interface FlagEntry {
  state: 'raised' | 'cleared';
  raisedByName: string;
  raisedAtIso: string;
  raiseReason: string;
  clearedByName: string | null;
  clearedAtIso: string | null;
  clearReason: string | null;
}

export interface FlagSuggestionEntry {
  /**
   * Null when the computation could make no suggestion (no Δf, e.g. no region-of-interest
   * channel remains); the report then says "No suggestion" and why.
   */
  suggestsSlowing: boolean | null;
  flagThresholdHz: number;
}

export interface ProvenanceEntry {
  kind: 'resting' | 'task';
  analysisRunId: string;
  settingsVersion: number;
  codeVersion: string;
  inputChecksumSha256: string;
  /** The run's analysis-depth settings (its settings version holds them too). */
  depthSettings: RunDepthSettings;
}

export interface SignatureEntry {
  signerName: string;
  signedAtIso: string;
  /** The meaning the signer confirmed (21 CFR Part 11 §11.50(a)(3)). */
  meaning: string;
}
