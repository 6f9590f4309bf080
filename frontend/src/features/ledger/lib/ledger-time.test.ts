import { describe, expect, it } from 'vitest';
import { formatLedgerTime, timeZoneNote } from './ledger-time';

// Offsets from the IANA time zone database: Berlin is UTC+1 (CET) in winter, UTC+2 (CEST) in
// summer; Kolkata UTC+5:30 all year.
describe('ledger times', () => {
  it("writes an instant in the viewer's zone with the zone's short name", () => {
    expect(formatLedgerTime('2026-12-02T13:03:12.000Z', 'Europe/Berlin')).toBe(
      '2 Dec 2026, 14:03:12 CET',
    );
    expect(formatLedgerTime('2026-07-02T13:03:12.000Z', 'Europe/Berlin')).toBe(
      '2 Jul 2026, 15:03:12 CEST',
    );
    expect(formatLedgerTime('2026-12-02T13:03:12.000Z', 'UTC')).toBe('2 Dec 2026, 13:03:12 UTC');
  });

  it('states the zone and its offset', () => {
    expect(timeZoneNote('Europe/Berlin', '2026-12-02T12:00:00Z')).toBe(
      'Times are shown in Europe/Berlin (UTC+01:00)',
    );
    expect(timeZoneNote('Asia/Kolkata', '2026-12-02T12:00:00Z')).toBe(
      'Times are shown in Asia/Kolkata (UTC+05:30)',
    );
  });
});
