import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

export enum ParticipantsError {
  NotFound = 'PARTICIPANT_NOT_FOUND',
  CodeTaken = 'PARTICIPANT_CODE_TAKEN',
  SiteRequired = 'PARTICIPANT_SITE_REQUIRED',
  BadDate = 'PARTICIPANT_BAD_DATE',
  GroupNotInStudy = 'PARTICIPANT_GROUP_NOT_IN_STUDY',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const PARTICIPANTS_ERROR_KINDS = {
  [ParticipantsError.NotFound]: ErrorKind.NotFound,
  [ParticipantsError.CodeTaken]: ErrorKind.Conflict,
  [ParticipantsError.SiteRequired]: ErrorKind.BadInput,
  [ParticipantsError.BadDate]: ErrorKind.BadInput,
  [ParticipantsError.GroupNotInStudy]: ErrorKind.BadInput,
} as const satisfies Record<ParticipantsError, ErrorKind>;

/** A GyreException of this module: the kind comes from PARTICIPANTS_ERROR_KINDS. */
export const participantsError = errorFactory(PARTICIPANTS_ERROR_KINDS);
