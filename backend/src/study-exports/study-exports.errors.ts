/** Error codes of the study results exports. */
export enum StudyExportsError {
  StudyNotFound = 'STUDY_EXPORT_STUDY_NOT_FOUND',
}
