import type { AnalysisSettingsValues } from '@gyre/shared';
import { canonicalElectrodeName } from '../signal/channels';

/**
 * Checks between fields that class-validator cannot express. Each problem names the
 * field, the value found and what is expected. Limits are common practice for alpha
 * work, not published rules.
 */
export function settingsProblems(values: AnalysisSettingsValues): string[] {
  const problems: string[] = [];
  const problem = (field: string, found: unknown, expected: string): void => {
    problems.push(`${field}: ${JSON.stringify(found)} found, ${expected} expected`);
  };
  if (values.bandHz !== null) {
    const [low, high] = values.bandHz;
    if (!(low >= 1 && high <= 40 && high - low >= 1)) {
      problem('bandHz', values.bandHz, 'low ≥ 1 Hz, high ≤ 40 Hz and at least 1 Hz wide');
    }
  }
  if (!(values.morletCycles >= 3 && values.morletCycles <= 20)) {
    problem('morletCycles', values.morletCycles, '3 to 20 cycles');
  }
  const [epochStart, epochEnd] = values.epochWindowS;
  if (!(epochStart < 0 && epochEnd > 0 && epochEnd - epochStart <= 20)) {
    problem('epochWindowS', values.epochWindowS, 'start < 0 < end, at most 20 s long');
  }
  const inEpoch = (field: string, [start, end]: [number, number]): void => {
    if (!(start < end && start >= epochStart && end <= epochEnd)) {
      problem(
        field,
        [start, end],
        `start < end, inside epochWindowS ${JSON.stringify(values.epochWindowS)}`,
      );
    }
  };
  inEpoch('baselineWindowS', values.baselineWindowS);
  inEpoch('postWindowS', values.postWindowS);
  if (values.baselineWindowS[1] > values.postWindowS[0]) {
    problem(
      'postWindowS',
      values.postWindowS,
      `a start at or after the baseline's end (${values.baselineWindowS[1]} s)`,
    );
  }
  if (values.baselineWindowS[1] > 0) {
    problem('baselineWindowS', values.baselineWindowS, 'an end at or before the onset (0 s)');
  }
  if (!(values.rejectionThresholdUv > 0 && values.rejectionThresholdUv <= 10_000)) {
    problem('rejectionThresholdUv', values.rejectionThresholdUv, '0 < threshold ≤ 10000 µV');
  }
  if (!(values.flagThresholdHz < 0 && values.flagThresholdHz >= -5)) {
    problem('flagThresholdHz', values.flagThresholdHz, 'a negative change between −5 and 0 Hz');
  }
  const unknown = values.roi.filter((name) => canonicalElectrodeName(name) === null);
  if (unknown.length > 0) problem('roi', unknown, '10-10 electrode names (ACNS 2016)');
  const gate = values.amplitudeGatePercentile;
  if (gate !== null && !(gate >= 1 && gate <= 90)) {
    problem('amplitudeGatePercentile', gate, 'off (null) or a percentile from 1 to 90');
  }
  if (!(values.cycleDisagreementHz > 0 && values.cycleDisagreementHz <= 2)) {
    problem('cycleDisagreementHz', values.cycleDisagreementHz, '0 < difference ≤ 2 Hz');
  }
  const pair = values.compareConditions;
  if (pair !== null) {
    const [first, second] = pair.map((label) => label.trim());
    if (first === '' || second === '' || first.toLowerCase() === second.toLowerCase()) {
      problem('compareConditions', pair, 'two different, non-empty onset labels');
    }
  }
  return problems;
}
