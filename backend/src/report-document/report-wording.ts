import { EPOCH_DROP_WORDS, type RoiOmissionReason, type RoiUsageView } from '@gyre/shared';
import type {
  ConditionDifferenceView,
  ConditionPairSource,
  ConditionStatsView,
  CycleEstimateView,
} from '@gyre/shared';
import {
  formatCiHz,
  formatDeltaHz,
  formatHz,
  formatNumber,
  formatPercent,
  formatPValue,
  formatSeconds,
  formatUtc,
} from './report-numbers';
import {
  ProvenanceEntry,
  QualitySection,
  RecordingSource,
  RestSection,
  TaskDepthSection,
  TaskSection,
} from './visit-report-model';

/** Gyre's research-use caution, printed on every page. */
export const RESEARCH_CAUTION =
  'Research use only. Not a diagnostic device: do not use these results for clinical ' +
  'decisions. Follow your study protocol, local regulations and licensed clinicians.';

/** What a signature means, as the signer confirms it (21 CFR Part 11 §11.50(a)(3)). */
export { SIGNATURE_MEANING } from '@gyre/shared';

const KIND_NAMES: Record<QualitySection['kind'], string> = {
  resting: 'Resting recording',
  task: 'Task recording',
};

export function kindName(kind: QualitySection['kind']): string {
  return KIND_NAMES[kind];
}

const NO_PEAK_WORDS: Record<string, string> = {
  'below-prominence': 'the highest alpha peak does not stand out of the 1/f background',
  'peak-at-search-edge': 'the highest value lies at the edge of the search window, not on a peak',
  'no-power': 'there is no power in the alpha window',
};

/** Why no PAF is given, in words; unknown codes are printed as they came. */
export function noPeakWords(rest: RestSection): string {
  if (rest.noPeakReason === null) return 'no clear peak';
  return `no clear peak: ${NO_PEAK_WORDS[rest.noPeakReason] ?? rest.noPeakReason}`;
}

/** "3 dropped: 2 amplitude beyond …, 1 too close to …" or "none dropped". */
export function droppedWords(task: TaskSection): string {
  const parts = Object.entries(task.droppedByReason)
    .filter(([, count]) => count > 0)
    .map(([reason, count]) => `${count} ${EPOCH_DROP_WORDS[reason] ?? reason}`);
  if (parts.length === 0) return 'none dropped';
  const total = Object.values(task.droppedByReason).reduce((sum, n) => sum + n, 0);
  return `${total} dropped (${parts.join('; ')})`;
}

/** Why a region-of-interest channel was left out, in Gyre's words. */
export const ROI_OMISSION_WORDS: Record<RoiOmissionReason, string> = {
  missing: 'not in the file',
  flat: 'flat',
  saturated: "saturated (runs at the converter's limit)",
  'sample-rate': 'another sampling rate',
  excluded: "left out by this visit's setting",
};

/** "Oz — saturated (…); POz — not in the file", or a note when nothing was asked for. */
function leftOutWords(usage: RoiUsageView): string {
  if (usage.leftOut.length === 0) return 'the settings name no channel for it';
  return usage.leftOut
    .map((omission) => `${omission.label} — ${ROI_OMISSION_WORDS[omission.reason]}`)
    .join('; ');
}

/**
 * Which region-of-interest channels a section's numbers rest on, e.g. "Region of interest:
 * O1, O2, Pz (3 of 5 wanted). Left out: Oz — saturated (…); POz — not in the file."
 * For status `none` see `noRoiWords`.
 */
export function roiUsageWords(usage: RoiUsageView): string {
  if (usage.status === 'complete' && usage.leftOut.length > 0) {
    // The default set's names the montage lacks: listed, not a doubt about the number.
    const absent = usage.leftOut.map((omission) => omission.label);
    return `Region of interest: ${list(usage.used)} (those present; not in the file: ${list(absent)}).`;
  }
  const count =
    usage.leftOut.length === 0
      ? `all ${usage.wanted.length} wanted`
      : `${usage.used.length} of ${usage.wanted.length} wanted`;
  const head = `Region of interest: ${list(usage.used)} (${count}).`;
  return usage.leftOut.length === 0 ? head : `${head} Left out: ${leftOutWords(usage)}.`;
}

/** Printed instead of any number when no region-of-interest channel remains. */
export function noRoiWords(usage: RoiUsageView, whatIsMissing: string): string {
  return (
    `No region-of-interest channel remains: ${leftOutWords(usage)}. ` +
    `No ${whatIsMissing} is reported.`
  );
}

/**
 * "Numbers from recording 3f2a9c1e, uploaded … UTC; replaces recording 9d0e1f2a: reason."
 * Without numbers (no ROI channel left) it begins "Analysed recording" instead.
 */
export function sourceWords(source: RecordingSource, hasNumbers = true): string {
  const head =
    `${hasNumbers ? 'Numbers from' : 'Analysed'} recording ${shortId(source.recordingId)}, ` +
    `uploaded ${formatUtc(source.uploadedAtIso)}`;
  if (source.replacesId === null) return `${head}.`;
  const reason = source.replacementReason?.trim() ?? '';
  const why = reason === '' ? ' (no reason recorded)' : `: ${reason}`;
  return endSentence(`${head}; replaces recording ${shortId(source.replacesId)}${why}`);
}

/** Beside a headline number resting on part of the ROI: "; from 3 of 5 … channels". */
export function partialRoiNote(usage: RoiUsageView): string {
  if (usage.status !== 'partial') return '';
  return `; from ${usage.used.length} of ${usage.wanted.length} region-of-interest channels`;
}

/** The first 8 characters of an id (a UUID's first group), enough to tell recordings apart. */
export function shortId(id: string): string {
  return id.slice(0, 8);
}

/** Adds a full stop unless the text (e.g. a typed reason) already ends a sentence. */
function endSentence(text: string): string {
  return /[.!?]$/.test(text) ? text : `${text}.`;
}

function list(names: string[]): string {
  return names.join(', ');
}

/** The quality checks of one recording as sentences a reader without the software follows. */
export function qualitySentences(q: QualitySection): string[] {
  const out: string[] = [];
  const rates = [...new Set(q.sampleRatesHz)];
  const ratesText = rates.length === 0 ? 'an unknown rate' : `${rates.join(', ')} Hz`;
  out.push(`Duration ${formatSeconds(q.durationS)}, sampled at ${ratesText}.`);
  if (q.roiChannelsFound.length === 0) {
    out.push('No channel of the region of interest was found.');
  } else {
    const missing =
      q.roiChannelsMissing.length > 0 ? `; not present: ${list(q.roiChannelsMissing)}` : '';
    out.push(
      `Region of interest: ${q.roiChannelsFound.length} channels found ` +
        `(${list(q.roiChannelsFound)})${missing}.`,
    );
  }
  out.push(
    q.flatChannels.length === 0
      ? 'No channel is flat.'
      : `Flat channels (almost no signal): ${list(q.flatChannels)}.`,
  );
  out.push(
    q.saturatedChannels.length === 0
      ? 'No channel is saturated.'
      : `Saturated channels (often at the limit of their range): ${list(q.saturatedChannels)}.`,
  );
  for (const [lineHz, ratio] of [
    [50, q.lineNoiseRatio50Hz],
    [60, q.lineNoiseRatio60Hz],
  ] as const) {
    if (ratio === null) continue;
    out.push(
      `Mains noise at ${lineHz} Hz: power there is ${formatNumber(ratio, 2)} times that of the ` +
        'neighbouring frequencies (about 1 means no mains noise).',
    );
  }
  if (q.epochsDroppedShare !== null) {
    out.push(`Epochs dropped: ${formatPercent(q.epochsDroppedShare)} of the stimulus onsets.`);
  }
  if (q.phaseSlipShare !== null) {
    out.push(
      `Phase slips: ${formatPercent(q.phaseSlipShare)} of the raw instantaneous-frequency ` +
        'values fall outside the band.',
    );
  }
  if (q.kind === 'resting') {
    out.push(
      q.alphaPeakProminenceDb === null
        ? 'No alpha peak stands out of the 1/f background.'
        : `The alpha peak stands ${formatNumber(q.alphaPeakProminenceDb, 1)} dB above the ` +
            '1/f background.',
    );
  }
  for (const warning of q.warnings) out.push(`Note: ${warning}`);
  return out;
}

const orMissing = <T>(value: T | null, print: (v: T) => string): string =>
  value === null ? 'not available' : print(value);

/** One condition's row: "−0.50 Hz; 95 % CI …; Wilcoxon p 0.002; 18 of 20 trials kept". */
export function conditionWords(condition: ConditionStatsView): string {
  return (
    `Δf ${orMissing(condition.deltaFHz, formatDeltaHz)}; ` +
    `95 % CI ${orMissing(condition.ciHz, formatCiHz)}; ` +
    `Wilcoxon p ${orMissing(condition.pValue, formatPValue)}; ` +
    `${condition.trialsKept} of ${condition.trialsTotal} trials kept`
  );
}

const PAIR_SOURCE_WORDS: Record<ConditionPairSource, string> = {
  settings: "named in the study's analysis settings",
  request: 'named for this computation',
  'first-two': 'the first two conditions found in the onsets (the settings name no pair)',
};

/** The difference row's label: it says it is a difference, and its order. */
export function differenceLabel(difference: ConditionDifferenceView): string {
  return `Difference ${difference.first} − ${difference.second}`;
}

/** The difference row: value, bootstrap CI and permutation p. */
export function differenceWords(difference: ConditionDifferenceView): string {
  return (
    `${orMissing(difference.differenceHz, formatDeltaHz)}; ` +
    `95 % CI ${orMissing(difference.ciHz, formatCiHz)}; ` +
    `permutation p ${orMissing(difference.pValue, formatPValue)}`
  );
}

/** Below the conditions: what the difference is and how its pair was chosen. */
export function differenceNote(difference: ConditionDifferenceView): string {
  return (
    `The difference is mean Δf of “${difference.first}” minus mean Δf of “${difference.second}”, ` +
    `the pair ${PAIR_SOURCE_WORDS[difference.chosenBy]}. Its CI resamples trials within each ` +
    `condition (bootstrap); its p is from a permutation test with ` +
    `${formatNumber(difference.permutations, 0)} label shuffles (seed ${difference.seed}).`
  );
}

/** The cycle-by-cycle row: its Δf, CI and how many trials and cycles it rests on. */
export function cycleWords(cycles: CycleEstimateView): string {
  const burst =
    cycles.burstCycleShare === null
      ? ''
      : `; ${formatPercent(cycles.burstCycleShare)} of cycles in bursts`;
  return (
    `${orMissing(cycles.deltaFHz, formatDeltaHz)}; 95 % CI ${orMissing(cycles.ciHz, formatCiHz)}; ` +
    `${cycles.trialsUsed} of ${cycles.trialsTotal} trials with burst cycles in both windows${burst}`
  );
}

/** The warning printed when the two estimates disagree, or null when they agree. */
export function disagreementWarning(depth: TaskDepthSection): string | null {
  const cycles = depth.cycles;
  if (cycles === null || !cycles.disagrees) return null;
  return (
    `Warning: the cycle-by-cycle and the phase-based Δf differ by ` +
    `${orMissing(cycles.disagreementHz, formatHz)}, more than the threshold of ` +
    `${formatHz(depth.cycleDisagreementHz)} in the settings the run was computed with. The rhythm may not be sinusoidal enough for the ` +
    'phase-based estimate.'
  );
}

/** "Percentile 25 of each channel's envelope; 24.8 % of the region's samples left out". */
export function amplitudeGateWords(gate: NonNullable<TaskDepthSection['amplitudeGate']>): string {
  const share =
    gate.totalSamples === 0
      ? 'no samples counted'
      : `${formatPercent(gate.excludedSamples / gate.totalSamples)} of the region's samples left out`;
  return `samples under percentile ${formatNumber(gate.percentile, 0)} of each channel's envelope; ${share}`;
}

/** The run's analysis-depth settings as provenance rows. */
export function depthSettingsRows(
  settings: ProvenanceEntry['depthSettings'],
): Array<[string, string]> {
  const pair = settings.compareConditions;
  return [
    [
      'Amplitude gate',
      settings.amplitudeGatePercentile === null
        ? 'off'
        : `percentile ${formatNumber(settings.amplitudeGatePercentile, 0)} of the envelope`,
    ],
    ['Cross-check threshold', formatHz(settings.cycleDisagreementHz)],
    ['Conditions compared', pair === null ? 'the first two found' : `“${pair[0]}” − “${pair[1]}”`],
  ];
}
