import type { VisitScheduleStatus } from '@gyre/shared';

/** What any answer says about a visit that blinded review hides from an analyst. */
export interface ShownVisitFacts {
  participantId: string | null;
  participantCode: string | null;
  visitLabel: string;
  visitDate: string | null;
  schedule: VisitScheduleStatus | null;
  blindCode: string | null;
}

/**
 * The one shaping of a visit for an analyst it is blinded for: its code in place of its label,
 * and no date, planned visit, window or participant (who leads to the other visits and the
 * group). `code` null: the caller sees the visit as it is.
 */
export function shownVisitFacts<T extends ShownVisitFacts>(facts: T, code: string | null): T {
  if (code === null) return facts;
  return {
    ...facts,
    participantId: null,
    participantCode: null,
    visitLabel: code,
    visitDate: null,
    schedule: null,
    blindCode: code,
  };
}
