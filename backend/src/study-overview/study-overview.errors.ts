/** Error codes of the study overview. */
export enum StudyOverviewError {
  StudyNotFound = 'STUDY_OVERVIEW_STUDY_NOT_FOUND',
}
