import type { TrajectoryDto } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/participants/:participantId/trajectory`: PAF, CoG and Δf per visit, with trends. */
export const trajectoryKey = (participantId: string) =>
  `/api/participants/${encodeURIComponent(participantId)}/trajectory`;

export function getTrajectory(participantId: string): Promise<TrajectoryDto> {
  return apiFetch<TrajectoryDto>(trajectoryKey(participantId));
}

export function useTrajectory(participantId: string) {
  return useSWR<TrajectoryDto>(trajectoryKey(participantId), () => getTrajectory(participantId));
}
