import type { MailContent } from '../mail/mail-templates';

/**
 * The coordinator's message when a report of their site is signed: a link into Gyre and
 * nothing else. No participant code, no result, no attachment: all of that stays behind
 * the sign-in.
 */
export const REPORT_SIGNED_KIND = 'report_signed';

export function reportSignedMail(options: {
  name: string;
  siteName: string;
  studyCode: string;
  revision: number;
  link: string;
}): MailContent {
  return {
    kind: REPORT_SIGNED_KIND,
    subject: `Gyre: a visit report of ${options.siteName} was signed`,
    text: [
      `Hello ${options.name},`,
      '',
      `A visit report of your site (${options.siteName}, study ${options.studyCode}) was signed in Gyre` +
        (options.revision > 1 ? ` as revision ${options.revision}.` : '.'),
      'Open and download it in Gyre (you will be asked to sign in):',
      '',
      options.link,
      '',
      'This message holds no results; they are only in Gyre.',
      'Gyre is research software, not a diagnostic device.',
    ].join('\n'),
  };
}

/** The client route that opens one signed revision. */
export function revisionLink(publicUrl: string, revisionId: string): string {
  return `${publicUrl}/reports/revisions?revision=${encodeURIComponent(revisionId)}`;
}
