import type { TrajectoryView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/participants/:participantId/trajectory`: PAF, CoG and Δf per visit, with trends. */
export const trajectoryKey = (participantId: string) =>
  `/api/participants/${encodeURIComponent(participantId)}/trajectory`;

export function getTrajectory(participantId: string): Promise<TrajectoryView> {
  return apiFetch<TrajectoryView>(trajectoryKey(participantId));
}

export function useTrajectory(participantId: string) {
  return useSWR<TrajectoryView>(trajectoryKey(participantId), () => getTrajectory(participantId));
}
