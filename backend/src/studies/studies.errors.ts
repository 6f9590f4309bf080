export enum StudiesError {
  NotFound = 'STUDY_NOT_FOUND',
  CodeTaken = 'STUDY_CODE_TAKEN',
}
