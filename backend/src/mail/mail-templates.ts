/**
 * Plain-text bodies of the messages Gyre sends; links go to client routes under PUBLIC_URL.
 * Every date in a message is written for people with its time zone named (mailDateTime),
 * never as a raw ISO stamp, and no message shows an internal id except inside a link.
 */
export interface MailContent {
  kind: string;
  subject: string;
  text: string;
}

export function invitationMail(options: {
  name: string;
  roleLabel: string;
  where: string;
  link: string;
  expiresAt: string;
}): MailContent {
  return {
    kind: 'invitation',
    subject: 'You are invited to Gyre',
    text: [
      `Hello ${options.name},`,
      '',
      `You have been invited to Gyre as ${options.roleLabel} (${options.where}).`,
      'Choose your password here to activate your account:',
      '',
      options.link,
      '',
      `The link works once and expires on ${mailDateTime(options.expiresAt)}.`,
      'If you did not expect this message, ignore it.',
      '',
      'Gyre is research software, not a diagnostic device.',
    ].join('\n'),
  };
}

export function passwordResetMail(options: {
  name: string;
  link: string;
  expiresAt: string;
}): MailContent {
  return {
    kind: 'password_reset',
    subject: 'Reset your Gyre password',
    text: [
      `Hello ${options.name},`,
      '',
      'Someone asked to reset the password of your Gyre account. To choose a new one, open:',
      '',
      options.link,
      '',
      `The link works once and expires on ${mailDateTime(options.expiresAt)}.`,
      'If it was not you, ignore this message: your password stays as it is.',
    ].join('\n'),
  };
}

const MONTHS = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
] as const;

/**
 * An instant as people read it in a message, in UTC and saying so: "9 December 2026, 02:36
 * UTC". The server cannot know the reader's time zone, so it names the one it writes in.
 * (Written out rather than Intl: the ICU wording of "at"/"," differs between Node builds.)
 */
export function mailDateTime(iso: string): string {
  const at = new Date(iso);
  if (Number.isNaN(at.getTime())) throw new Error(`Not an instant: ${JSON.stringify(iso)}`);
  const two = (n: number): string => String(n).padStart(2, '0');
  return (
    `${at.getUTCDate()} ${MONTHS[at.getUTCMonth()]} ${at.getUTCFullYear()}, ` +
    `${two(at.getUTCHours())}:${two(at.getUTCMinutes())} UTC`
  );
}

/** A calendar day (YYYY-MM-DD) as people read it: "2 March 2026". */
export function mailDate(day: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(day);
  if (match === null) throw new Error(`Not a calendar day: ${JSON.stringify(day)}`);
  return `${Number(match[3])} ${MONTHS[Number(match[2]) - 1]} ${match[1]}`;
}

export function clientLink(publicUrl: string, route: string, token: string): string {
  return `${publicUrl}${route}?token=${encodeURIComponent(token)}`;
}
