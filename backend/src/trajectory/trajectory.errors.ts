import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of participant trajectories. */
export enum TrajectoryError {
  ParticipantNotFound = 'TRAJECTORY_PARTICIPANT_NOT_FOUND',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const TRAJECTORY_ERROR_KINDS = {
  [TrajectoryError.ParticipantNotFound]: ErrorKind.NotFound,
} as const satisfies Record<TrajectoryError, ErrorKind>;

/** A GyreException of this module: the kind comes from TRAJECTORY_ERROR_KINDS. */
export const trajectoryError = errorFactory(TRAJECTORY_ERROR_KINDS);
