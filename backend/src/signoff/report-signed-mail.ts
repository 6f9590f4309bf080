import { mailDate, mailDateTime, type MailContent } from '../mail/mail-templates';

/**
 * The coordinator's message when a report of their site is signed: which report (the
 * participant's pseudonymous code, the visit, the study and site) and a link into Gyre. No
 * result and no attachment: the numbers stay behind the sign-in.
 */
export const REPORT_SIGNED_KIND = 'report_signed';

export function reportSignedMail(options: {
  name: string;
  siteName: string;
  studyCode: string;
  participantCode: string;
  visitLabel: string;
  /** The visit's calendar day, YYYY-MM-DD. */
  visitDate: string;
  revision: number;
  /** When it was signed (ISO instant). */
  signedAt: string;
  link: string;
}): MailContent {
  const which = `${options.participantCode}, visit ${options.visitLabel}`;
  return {
    kind: REPORT_SIGNED_KIND,
    subject: `Gyre: report signed for ${which} (${options.siteName})`,
    text: [
      `Hello ${options.name},`,
      '',
      `The visit report of participant ${options.participantCode}, visit ${options.visitLabel} ` +
        `of ${mailDate(options.visitDate)} (study ${options.studyCode}, ${options.siteName}), ` +
        `was signed in Gyre on ${mailDateTime(options.signedAt)}` +
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
