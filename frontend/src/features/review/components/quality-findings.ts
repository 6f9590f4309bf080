import type { QualityView, RoiUsageView } from '@gyre/shared';
import { NO_ROI_CHANNEL_REMAINS, roiUsageSentence } from '../../../lib/roi-usage';
import { formatNumber, formatSeconds, formatShareAsPercent } from '../../../lib/format';

export interface QualityFinding {
  check: string;
  value: string;
  /** A plain-word warning when the check needs the analyst's attention. */
  warning: string | null;
}

const list = (names: string[]) => names.join(', ');
const percent = (share: number) => formatShareAsPercent(share);
const ratio = (value: number | null) => formatNumber(value, 2);
const rates = (ratesHz: number[]) => {
  const distinct = [...new Set(ratesHz)].sort((a, b) => a - b);
  return distinct.length === 0
    ? '—'
    : distinct.map((r) => `${formatNumber(r, 0)}\u00a0Hz`).join(', ');
};

/** Mains power this many times its neighbours' is worth a look (common practice). */
export const LINE_NOISE_WARNING_RATIO = 10;

/** The line frequencies to check: the declared one alone, or both when none was declared. */
export function checkedLineFrequencies(lineFrequencyHz: 50 | 60 | null): Array<50 | 60> {
  return lineFrequencyHz === null ? [50, 60] : [lineFrequencyHz];
}

const lineRatio = (
  quality: { lineNoiseRatio50Hz: number | null; lineNoiseRatio60Hz: number | null },
  hz: 50 | 60,
) => (hz === 50 ? quality.lineNoiseRatio50Hz : quality.lineNoiseRatio60Hz);

function lineNoiseWarning(quality: QualityView, lineFrequencyHz: 50 | 60 | null): string | null {
  const worst = checkedLineFrequencies(lineFrequencyHz)
    .map((hz) => [hz, lineRatio(quality, hz)])
    .filter(
      (entry): entry is [number, number] =>
        entry[1] !== null && entry[1] >= LINE_NOISE_WARNING_RATIO,
    );
  if (worst.length === 0) return null;
  const [lineHz, value] = worst.sort((a, b) => b[1] - a[1])[0];
  return `Strong mains noise at ${lineHz} Hz (${formatNumber(value, 1)} times the neighbouring power): the alpha band-pass removes it, but it often means poor electrode contact or ungrounded equipment.`;
}

/**
 * The quality checks of docs/method.md §6 in plain words. The limits that turn a value into a
 * warning are common practice for reviewing alpha recordings, not published rules; the
 * server's own warnings are shown beside these, word for word.
 */
export function qualityFindings(
  quality: QualityView,
  kind: 'task' | 'resting',
  /** The run's region-of-interest usage: what was found is not always what was used. */
  roiUsage?: RoiUsageView,
  /** The power line frequency the recording's source declared (EEG-BIDS), if any. */
  lineFrequencyHz: 50 | 60 | null = null,
): QualityFinding[] {
  const minutes = quality.durationS / 60;
  const findings: QualityFinding[] = [
    {
      check: 'Duration',
      value:
        minutes >= 1 ? `${formatNumber(minutes, 1)}\u00a0min` : formatSeconds(quality.durationS),
      warning:
        quality.durationS < 60
          ? 'The recording is shorter than a minute, so the estimates rest on little data.'
          : null,
    },
    {
      check: 'Sampling rate',
      value: rates(quality.sampleRatesHz),
      warning:
        quality.sampleRatesHz.length > 0 && Math.min(...quality.sampleRatesHz) < 100
          ? 'The sampling rate is low for alpha work; frequencies near the band edges may be distorted.'
          : null,
    },
    {
      check: 'Region-of-interest channels found',
      value:
        (quality.roiChannelsFound.length === 0 ? 'none' : list(quality.roiChannelsFound)) +
        (quality.roiChannelsMissing.length === 0
          ? ''
          : ` (missing: ${list(quality.roiChannelsMissing)})`),
      warning:
        quality.roiChannelsFound.length === 0
          ? `${NO_ROI_CHANNEL_REMAINS}: none of them is in the file, so there is no ROI result.`
          : quality.roiChannelsFound.length < 3
            ? `Only ${quality.roiChannelsFound.length} region-of-interest channel(s) found; the ROI average is fragile.`
            : null,
    },
    ...(roiUsage === undefined
      ? []
      : [
          {
            check: 'Region-of-interest channels used',
            value: roiUsage.used.length === 0 ? 'none' : list(roiUsage.used),
            warning:
              // A file without any region channel is already said above.
              quality.roiChannelsFound.length === 0 ? null : roiUsageSentence(roiUsage),
          },
        ]),
    {
      check: 'Flat channels',
      value: quality.flatChannels.length === 0 ? 'none' : list(quality.flatChannels),
      warning:
        quality.flatChannels.length === 0
          ? null
          : `No signal on ${list(quality.flatChannels)}: check the electrodes and their connection.`,
    },
    {
      check: 'Saturated channels',
      value: quality.saturatedChannels.length === 0 ? 'none' : list(quality.saturatedChannels),
      warning:
        quality.saturatedChannels.length === 0
          ? null
          : `${list(quality.saturatedChannels)} reached the amplifier's limits: parts of the signal are clipped.`,
    },
    lineFrequencyHz === null
      ? {
          check: 'Line noise (50 Hz / 60 Hz)',
          value: `${ratio(quality.lineNoiseRatio50Hz)} / ${ratio(quality.lineNoiseRatio60Hz)} (median power ratio over channels)`,
          warning: lineNoiseWarning(quality, null),
        }
      : {
          check: `Line noise (${lineFrequencyHz} Hz, as the file's source declared)`,
          value: `${ratio(lineRatio(quality, lineFrequencyHz))} (median power ratio over channels)`,
          warning: lineNoiseWarning(quality, lineFrequencyHz),
        },
  ];
  if (kind === 'task') {
    findings.push(
      {
        check: 'Epochs dropped',
        value: quality.epochsDroppedShare === null ? '—' : percent(quality.epochsDroppedShare),
        warning:
          quality.epochsDroppedShare !== null && quality.epochsDroppedShare > 0.5
            ? 'More than half of the epochs were dropped; the onset result rests on few trials.'
            : null,
      },
      {
        check: 'Phase slips',
        value: quality.phaseSlipShare === null ? '—' : percent(quality.phaseSlipShare),
        warning:
          quality.phaseSlipShare !== null && quality.phaseSlipShare > 0.1
            ? 'Many instantaneous-frequency samples fall outside the band: the alpha rhythm may be weak here.'
            : null,
      },
    );
  }
  if (kind === 'resting') {
    findings.push({
      check: 'Alpha peak prominence',
      value:
        quality.alphaPeakProminenceDb === null
          ? 'no clear peak'
          : `${formatNumber(quality.alphaPeakProminenceDb, 1)}\u00a0dB over the background`,
      warning:
        quality.alphaPeakProminenceDb === null
          ? 'No alpha peak stands out of the background, so the PAF is not given; the CoG still is.'
          : null,
    });
  }
  return findings;
}
