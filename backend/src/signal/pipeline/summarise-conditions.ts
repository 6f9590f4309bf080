import type { ConditionDifferenceView } from '@gyre/shared';
import type { EpochDropReason } from '../trials/epochs';
import type { OnsetCurveScratch } from '../trials/onset-statistics';
import {
  chooseConditionPair,
  conditionDifference,
  groupConditions,
} from '../trials/condition-statistics';
import type { AnalysisComputation } from './analysis-computation';
import type { AnalysisSettings } from './analysis-settings';
import type { ConditionResult } from './analysis.types';
import { summariseOnsets } from './summarise-onsets';

export interface ConditionsSummary {
  conditions: ConditionResult[];
  difference: ConditionDifferenceView | null;
  /** Why a named difference is missing (a label without trials), for the run's warnings. */
  warnings: string[];
}

/**
 * The region of interest's statistics per condition (onset label) and the difference of two
 * conditions (docs/method.md, "Conditions"): each condition's trials summarised exactly as
 * the whole region (`summariseOnsets`: baseline, post, Δf, bootstrap interval, Wilcoxon p,
 * curve), then Δf(first) − Δf(second) of the pair `settings.compareConditions` or
 * `requested` names, else of the first two conditions found.
 */
export function summariseConditions(
  epochs: Float64Array,
  reasons: readonly (EpochDropReason | null)[],
  labels: readonly string[],
  sampleRateHz: number,
  settings: Readonly<AnalysisSettings>,
  computation: AnalysisComputation,
  requested: readonly [string, string] | null,
  scratch?: OnsetCurveScratch,
): ConditionsSummary {
  const conditions = groupConditions(labels).map((group): ConditionResult => {
    const ownReasons = group.trials.map((trial) => reasons[trial]);
    const kept = group.trials.filter((trial) => reasons[trial] === null);
    const { summary } = summariseOnsets(
      epochs,
      kept,
      ownReasons,
      sampleRateHz,
      settings,
      computation,
      scratch,
    );
    return {
      label: group.label,
      trialsKept: summary.trialsKept,
      trialsTotal: group.trials.length,
      baselineHz: summary.baselineHz,
      postHz: summary.postHz,
      deltaFHz: summary.deltaFHz,
      ciHz: summary.ciHz,
      pValue: summary.pValue,
      trialDeltaFHz: Float64Array.from(
        summary.trialPostHz,
        (post, k) => post - summary.trialBaselineHz[k],
      ),
      curve: summary.curve,
    };
  });
  const choice = chooseConditionPair(
    conditions.map((c) => c.label),
    // Settings stored before conditions existed lack the key.
    settings.compareConditions ?? null,
    requested,
  );
  if (choice.pair === null) {
    const warnings = choice.unknown.map(
      (name) =>
        `Condition "${name}" named for the difference has no trials ` +
        `(conditions found: ${conditions.map((c) => `"${c.label}"`).join(', ') || 'none'}).`,
    );
    return { conditions, difference: null, warnings };
  }
  const [first, second] = choice.pair.map((label) => conditions.find((c) => c.label === label));
  if (first === undefined || second === undefined) {
    throw new Error(`conditions: the chosen pair ${choice.pair.join(', ')} is not among them`);
  }
  const empty = [first, second].filter((c) => c.trialsKept === 0);
  if (empty.length > 0) {
    const warnings = empty.map(
      (c) => `Condition "${c.label}" has no kept trial: no difference between conditions.`,
    );
    return { conditions, difference: null, warnings };
  }
  return {
    conditions,
    difference: conditionDifference(
      { first: first.label, second: second.label, chosenBy: choice.chosenBy },
      first.trialDeltaFHz,
      second.trialDeltaFHz,
    ),
    warnings: [],
  };
}
