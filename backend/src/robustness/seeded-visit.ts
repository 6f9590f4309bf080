import { randomUUID } from 'node:crypto';
import type { ModelRowColumns } from '../common/database/model-columns';
import type { Participant } from '../participants/participant.entity';
import type { Site } from '../sites/site.entity';
import type { Visit } from '../visits/visit.entity';

/** When a seeded row was made and last changed (the same moment). */
export type SeedStamp = Pick<ModelRowColumns, 'createdAt' | 'updatedAt'>;

/**
 * A participant `code` of `site` with its one visit `V1` on a fixed day, as the crash test's
 * seed and the API tests' seed (backend/test/helpers/seed.ts) write them straight into the
 * database. Generated data.
 */
export function seededParticipantVisit(
  site: Site,
  code: string,
  stamp: SeedStamp,
): { participant: Participant; visit: Visit } {
  const participant: Participant = {
    id: randomUUID(),
    studyId: site.studyId,
    siteId: site.id,
    code,
    enrolmentDate: null,
    groupId: null,
    ...stamp,
  };
  const visit: Visit = {
    id: randomUUID(),
    participantId: participant.id,
    studyId: site.studyId,
    siteId: site.id,
    label: 'V1',
    plannedVisitId: null,
    visitDate: '2026-01-15',
    ...stamp,
  };
  return { participant, visit };
}
