import type { VisitAnalysisOverrideValues } from '@gyre/shared';
import {
  AnalysisSettings,
  copyAnalysisSettings,
  DEFAULT_ANALYSIS_SETTINGS,
} from '../signal/pipeline/analysis-settings';
import { settingsProblems } from './analysis-settings.rules';

/** Reads stored settings JSON back, refusing anything that is not a whole, valid value. */
export function parseStoredSettings(json: string): AnalysisSettings {
  const parsed = JSON.parse(json) as Partial<AnalysisSettings>;
  const keys = Object.keys(DEFAULT_ANALYSIS_SETTINGS).sort();
  const found = Object.keys(parsed).sort();
  if (JSON.stringify(keys) !== JSON.stringify(found)) {
    throw new Error(`stored settings: keys ${found.join(',')} found, ${keys.join(',')} expected`);
  }
  const settings = parsed as AnalysisSettings;
  const problems = settingsProblems(settings);
  if (problems.length > 0) throw new Error(`stored settings: ${problems.join('; ')}`);
  return settings;
}

/** The settings JSON in one fixed key order, so equal settings are equal text. */
export function settingsJson(settings: AnalysisSettings): string {
  const ordered = copyAnalysisSettings(settings);
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(DEFAULT_ANALYSIS_SETTINGS)) {
    out[key] = ordered[key as keyof AnalysisSettings];
  }
  return JSON.stringify(out);
}

/** The study's settings with a visit's own choices laid over them. */
export function withOverride(
  study: AnalysisSettings,
  override: VisitAnalysisOverrideValues | null,
): AnalysisSettings {
  const merged = copyAnalysisSettings(study);
  if (override === null) return merged;
  if (override.roi !== null) merged.roi = [...override.roi];
  if (override.bandHz !== null) merged.bandHz = [override.bandHz[0], override.bandHz[1]];
  if (override.onsetLabel !== null) merged.onsetLabel = override.onsetLabel;
  return merged;
}
