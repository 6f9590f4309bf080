import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of analysis settings, runs and results. */
export enum AnalysisError {
  StudyNotFound = 'ANALYSIS_STUDY_NOT_FOUND',
  SettingsInvalid = 'ANALYSIS_SETTINGS_INVALID',
  RunNotFound = 'ANALYSIS_RUN_NOT_FOUND',
  NoResultsYet = 'ANALYSIS_NO_RESULTS_YET',
  /** A trial raster asked of a run without task results (resting, or no ROI channel left). */
  NoTaskResults = 'ANALYSIS_NO_TASK_RESULTS',
  /** A channel's onset curve asked of a run that has none for that channel. */
  ChannelCurveNotFound = 'ANALYSIS_CHANNEL_CURVE_NOT_FOUND',
  /** A new settings version with the values of the current one. */
  SettingsUnchanged = 'ANALYSIS_SETTINGS_UNCHANGED',
  OverrideInvalid = 'ANALYSIS_OVERRIDE_INVALID',
  OverrideUnchanged = 'ANALYSIS_OVERRIDE_UNCHANGED',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const ANALYSIS_ERROR_KINDS = {
  [AnalysisError.StudyNotFound]: ErrorKind.NotFound,
  [AnalysisError.SettingsInvalid]: ErrorKind.BadInput,
  [AnalysisError.RunNotFound]: ErrorKind.NotFound,
  [AnalysisError.NoResultsYet]: ErrorKind.NotFound,
  [AnalysisError.NoTaskResults]: ErrorKind.NotFound,
  [AnalysisError.ChannelCurveNotFound]: ErrorKind.NotFound,
  [AnalysisError.SettingsUnchanged]: ErrorKind.Conflict,
  [AnalysisError.OverrideInvalid]: ErrorKind.BadInput,
  [AnalysisError.OverrideUnchanged]: ErrorKind.Conflict,
} as const satisfies Record<AnalysisError, ErrorKind>;

/** A GyreException of this module: the kind comes from ANALYSIS_ERROR_KINDS. */
export const analysisError = errorFactory(ANALYSIS_ERROR_KINDS);
