/** Error codes of participant trajectories. */
export enum TrajectoryError {
  ParticipantNotFound = 'TRAJECTORY_PARTICIPANT_NOT_FOUND',
}
