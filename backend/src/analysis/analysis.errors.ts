/** Error codes of analysis settings, runs and results. */
export enum AnalysisError {
  StudyNotFound = 'ANALYSIS_STUDY_NOT_FOUND',
  SettingsInvalid = 'ANALYSIS_SETTINGS_INVALID',
  RecordingNotFound = 'ANALYSIS_RECORDING_NOT_FOUND',
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
