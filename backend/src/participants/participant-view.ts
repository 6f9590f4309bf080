import type { ParticipantView } from '@gyre/shared';
import { Participant } from './participant.entity';

export function toParticipantView(participant: Participant): ParticipantView {
  return {
    id: participant.id,
    studyId: participant.studyId,
    siteId: participant.siteId,
    code: participant.code,
    enrolmentDate: participant.enrolmentDate,
    groupId: participant.groupId,
    createdAt: participant.createdAt,
    updatedAt: participant.updatedAt,
  };
}
