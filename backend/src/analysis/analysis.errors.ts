/** Error codes of analysis settings, runs and results. */
export enum AnalysisError {
  StudyNotFound = 'ANALYSIS_STUDY_NOT_FOUND',
  SettingsInvalid = 'ANALYSIS_SETTINGS_INVALID',
  RecordingNotFound = 'ANALYSIS_RECORDING_NOT_FOUND',
  RunNotFound = 'ANALYSIS_RUN_NOT_FOUND',
  NoResultsYet = 'ANALYSIS_NO_RESULTS_YET',
}
