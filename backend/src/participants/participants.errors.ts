export enum ParticipantsError {
  NotFound = 'PARTICIPANT_NOT_FOUND',
  CodeTaken = 'PARTICIPANT_CODE_TAKEN',
  SiteRequired = 'PARTICIPANT_SITE_REQUIRED',
  BadDate = 'PARTICIPANT_BAD_DATE',
  GroupNotInStudy = 'PARTICIPANT_GROUP_NOT_IN_STUDY',
}
