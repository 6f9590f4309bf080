import { invitationMail, mailDate, mailDateTime, passwordResetMail } from './mail-templates';

describe('dates in e-mails', () => {
  // Expected strings from Python 3: datetime.fromtimestamp(s, timezone.utc)
  //   .strftime('%-d %B %Y, %H:%M UTC') for the same instants (outside Gyre's code).
  it.each([
    ['2026-12-09T02:36:43.095Z', '9 December 2026, 02:36 UTC'],
    ['2026-03-02T00:00:00.000Z', '2 March 2026, 00:00 UTC'],
    ['2024-02-29T23:59:59.999Z', '29 February 2024, 23:59 UTC'],
    ['2000-02-29T00:00:00Z', '29 February 2000, 00:00 UTC'],
    // The same instant written with an offset is still said in UTC.
    ['2026-12-09T03:36:43+01:00', '9 December 2026, 02:36 UTC'],
  ])('writes %s as %s', (iso, words) => {
    expect(mailDateTime(iso)).toBe(words);
  });

  it('writes a calendar day without a time', () => {
    expect(mailDate('2026-03-02')).toBe('2 March 2026');
    expect(mailDate('2024-12-31')).toBe('31 December 2024');
  });

  it('refuses what is not a date instead of writing "Invalid Date"', () => {
    expect(() => mailDateTime('soon')).toThrow(/Not an instant/);
    expect(() => mailDate('2026-3-2')).toThrow(/Not a calendar day/);
  });

  it('no template carries a raw ISO stamp', () => {
    const iso = /\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/;
    const expiresAt = '2026-12-09T02:36:43.095Z';
    const invitation = invitationMail({
      name: 'N',
      roleLabel: 'analyst',
      where: 'Study',
      link: 'https://gyre.test/x',
      expiresAt,
    });
    const reset = passwordResetMail({ name: 'N', link: 'https://gyre.test/y', expiresAt });
    for (const mail of [invitation, reset]) {
      expect(mail.text).not.toMatch(iso);
      expect(mail.text).toContain('expires on 9 December 2026, 02:36 UTC.');
    }
  });
});
