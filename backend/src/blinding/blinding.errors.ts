import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of blinded review. */
export enum BlindingError {
  VisitNotFound = 'BLINDING_VISIT_NOT_FOUND',
  VisitBlinded = 'BLINDING_VISIT_BLINDED',
  NotBlinded = 'BLINDING_NOT_BLINDED',
  StudyClosed = 'BLINDING_STUDY_CLOSED',
  ParticipantBlinded = 'BLINDING_PARTICIPANT_BLINDED',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const BLINDING_ERROR_KINDS = {
  [BlindingError.VisitNotFound]: ErrorKind.NotFound,
  [BlindingError.VisitBlinded]: ErrorKind.Forbidden,
  [BlindingError.NotBlinded]: ErrorKind.Conflict,
  [BlindingError.StudyClosed]: ErrorKind.Forbidden,
  [BlindingError.ParticipantBlinded]: ErrorKind.Forbidden,
} as const satisfies Record<BlindingError, ErrorKind>;

/** A GyreException of this module: the kind comes from BLINDING_ERROR_KINDS. */
export const blindingError = errorFactory(BLINDING_ERROR_KINDS);
