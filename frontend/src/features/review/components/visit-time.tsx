import { createContext, useContext } from 'react';
import { formatAfterFirstUpload, formatDateTime } from '../../../lib/format';

/**
 * Whether Review's visit is blinded for the caller, for the way its time stamps are written.
 * Under blinded review the server sends the times of such a visit's recordings, runs and
 * report as their distance from its first upload (counted from 1970-01-01), so they read
 * "+12 min after first upload", never as a date; otherwise they are dates. ReviewPage owns
 * the value (from the visit's blinding).
 */
const VisitBlindedContext = createContext(false);

export function VisitTimeProvider({
  blinded,
  children,
}: {
  blinded: boolean;
  children: React.ReactNode;
}) {
  return <VisitBlindedContext value={blinded}>{children}</VisitBlindedContext>;
}

/** Whether the visit's times are counted from its first upload (see VisitTimeProvider). */
function useVisitTimesBlinded(): boolean {
  return useContext(VisitBlindedContext);
}

/** How to write a time stamp of the visit (see VisitTimeProvider). */
export function useVisitTime(): (value: string | null | undefined) => string {
  return useVisitTimesBlinded() ? formatAfterFirstUpload : formatDateTime;
}
