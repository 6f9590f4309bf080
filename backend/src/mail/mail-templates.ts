/** Plain-text bodies of the messages Gyre sends; links go to client routes under PUBLIC_URL. */
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
      `The link works once and expires at ${options.expiresAt}.`,
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
      `The link works once and expires at ${options.expiresAt}.`,
      'If it was not you, ignore this message: your password stays as it is.',
    ].join('\n'),
  };
}

export function clientLink(publicUrl: string, route: string, token: string): string {
  return `${publicUrl}${route}?token=${encodeURIComponent(token)}`;
}
