/** Error codes of analysis settings, runs and results. */
export enum AnalysisError {
  StudyNotFound = 'ANALYSIS_STUDY_NOT_FOUND',
  SettingsInvalid = 'ANALYSIS_SETTINGS_INVALID',
  RecordingNotFound = 'ANALYSIS_RECORDING_NOT_FOUND',
  RunNotFound = 'ANALYSIS_RUN_NOT_FOUND',
  NoResultsYet = 'ANALYSIS_NO_RESULTS_YET',
  /** A new settings version with the values of the current one. */
  SettingsUnchanged = 'ANALYSIS_SETTINGS_UNCHANGED',
  OverrideInvalid = 'ANALYSIS_OVERRIDE_INVALID',
  OverrideUnchanged = 'ANALYSIS_OVERRIDE_UNCHANGED',
}
