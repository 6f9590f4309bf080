import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

/** One message as the fake SMTP server stored it, headers parsed and the text body decoded. */
export interface CaughtMail {
  file: string;
  to: string;
  from: string;
  subject: string;
  text: string;
  raw: string;
}

/** Every `.eml` under the mail folder, oldest first. */
export function readMails(mailDir: string): CaughtMail[] {
  let names: string[];
  try {
    names = readdirSync(mailDir).filter((name) => name.endsWith('.eml'));
  } catch {
    return [];
  }
  return names.sort().map((name) => parseEml(name, readFileSync(join(mailDir, name), 'utf8')));
}

/** Polls the mail folder until a message to `to` arrives (the real SMTP round trip). */
export async function waitForMail(
  mailDir: string,
  match: { to: string; subject?: RegExp },
  timeoutMs = 10_000,
): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = readMails(mailDir).find(
      (mail) =>
        mail.to.toLowerCase().includes(match.to.toLowerCase()) &&
        (match.subject === undefined || match.subject.test(mail.subject)),
    );
    if (found !== undefined) return found;
    if (Date.now() > deadline) {
      throw new Error(`No e-mail to ${match.to} arrived in ${mailDir} within ${timeoutMs} ms`);
    }
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/** The `token` query parameter of the first link to `route` in the message. */
export function tokenFromMail(mail: CaughtMail, route: string): string {
  const match = new RegExp(
    `https?://\\S+${route.replace(/[/]/g, '\\/')}\\?token=([A-Za-z0-9_%-]+)`,
  ).exec(mail.text);
  if (match === null) throw new Error(`No ${route} link in the message:\n${mail.text}`);
  return decodeURIComponent(match[1]);
}

/** Minimal RFC 5322 / MIME reading: unfolded headers; 7bit, quoted-printable or base64 body. */
function parseEml(file: string, raw: string): CaughtMail {
  const split = raw.search(/\r?\n\r?\n/);
  const headerText = raw.slice(0, split).replace(/\r?\n[ \t]+/g, ' ');
  const body = raw.slice(split).replace(/^\r?\n\r?\n/, '');
  const headers = new Map<string, string>();
  for (const line of headerText.split(/\r?\n/)) {
    const index = line.indexOf(':');
    if (index > 0)
      headers.set(line.slice(0, index).trim().toLowerCase(), line.slice(index + 1).trim());
  }
  const encoding = (headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  let text = body;
  if (encoding === 'quoted-printable') {
    const bytes = body
      .replace(/=\r?\n/g, '')
      .replace(/=([0-9A-Fa-f]{2})/g, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16)));
    text = Buffer.from(bytes, 'latin1').toString('utf8');
  } else if (encoding === 'base64') {
    text = Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
  }
  return {
    file,
    to: headers.get('to') ?? '',
    from: headers.get('from') ?? '',
    subject: headers.get('subject') ?? '',
    text: text.replace(/\r\n/g, '\n'),
    raw,
  };
}
