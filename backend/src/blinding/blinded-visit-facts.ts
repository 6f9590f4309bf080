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

/**
 * The instant a blinded visit's first upload is shown at: every time stamp of the visit's
 * recordings, runs, report and worklist items is shown as its distance from that upload,
 * counted from here, so order and intervals stay and the calendar date does not.
 */
export const BLINDED_TIME_ZERO = '1970-01-01T00:00:00.000Z';

/** A time stamp of a blinded visit, as the distance from `origin` (its first upload). */
export type BlindedClock = (iso: string) => string;

export function blindedClock(origin: string | null): BlindedClock {
  const zero = origin === null ? Number.NaN : Date.parse(origin);
  return (iso) => {
    const at = Date.parse(iso);
    return Number.isNaN(zero) || Number.isNaN(at)
      ? BLINDED_TIME_ZERO
      : new Date(Math.max(0, at - zero)).toISOString();
  };
}

/** A visit still blinded for the caller: its code and its clock. */
export interface BlindedVisit {
  code: string;
  clock: BlindedClock;
}
