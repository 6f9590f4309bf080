import { formatNumber, formatPercent, formatSeconds } from './report-numbers';
import { QualitySection, RestSection, TaskSection } from './visit-report-model';

/** Research-use caution of DESIGN.md, printed on every page. */
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

const DROP_WORDS: Record<string, string> = {
  edge: 'too close to the recording edge',
  amplitude: 'amplitude beyond the rejection threshold',
  artefact: 'overlapping an artefact annotation',
};

/** "3 dropped: 2 amplitude beyond …, 1 too close to …" or "none dropped". */
export function droppedWords(task: TaskSection): string {
  const parts = Object.entries(task.droppedByReason)
    .filter(([, count]) => count > 0)
    .map(([reason, count]) => `${count} ${DROP_WORDS[reason] ?? reason}`);
  if (parts.length === 0) return 'none dropped';
  const total = Object.values(task.droppedByReason).reduce((sum, n) => sum + n, 0);
  return `${total} dropped (${parts.join('; ')})`;
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
