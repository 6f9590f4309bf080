import dayjs from 'dayjs';
import timezone from 'dayjs/plugin/timezone';
import utc from 'dayjs/plugin/utc';

dayjs.extend(utc);
dayjs.extend(timezone);

/** The viewer's time zone as the browser reports it (IANA name), e.g. `Europe/Berlin`. */
export function viewerTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
}

/** An instant in the viewer's zone with the zone's short name: `2 Dec 2026, 14:03:12 CET`. */
export function formatLedgerTime(iso: string, zone = viewerTimeZone()): string {
  const at = dayjs(iso);
  if (!at.isValid()) return iso;
  return `${at.tz(zone).format('D MMM YYYY, HH:mm:ss')} ${zoneName(at.toDate(), zone)}`;
}

/** The zone's short name at that instant in British English (`CET`, `BST`, `UTC`, `GMT-5`). */
function zoneName(at: Date, zone: string): string {
  const part = new Intl.DateTimeFormat('en-GB', { timeZone: zone, timeZoneName: 'short' })
    .formatToParts(at)
    .find((p) => p.type === 'timeZoneName');
  return part?.value ?? zone;
}

/** The note under the Ledger: `Times are shown in Europe/Berlin (UTC+01:00)`. */
export function timeZoneNote(
  zone = viewerTimeZone(),
  now: string = new Date().toISOString(),
): string {
  return `Times are shown in ${zone} (UTC${dayjs(now).tz(zone).format('Z')})`;
}
