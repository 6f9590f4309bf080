import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { type AddressObject, simpleParser } from 'mailparser';

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
export async function readMails(mailDir: string): Promise<CaughtMail[]> {
  let names: string[];
  try {
    names = readdirSync(mailDir).filter((name) => name.endsWith('.eml'));
  } catch {
    return [];
  }
  return Promise.all(
    names.sort().map((name) => parseEml(name, readFileSync(join(mailDir, name), 'utf8'))),
  );
}

/** Polls the mail folder until a message to `to` arrives (the real SMTP round trip). */
export async function waitForMail(
  mailDir: string,
  match: { to: string; subject?: RegExp },
  timeoutMs = 10_000,
): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await readMails(mailDir)).find(
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

/** One `.eml` read by mailparser (headers decoded, any transfer encoding, the text part). */
async function parseEml(file: string, raw: string): Promise<CaughtMail> {
  const parsed = await simpleParser(raw);
  const addresses = (value: AddressObject | AddressObject[] | undefined): string =>
    (Array.isArray(value) ? value : value === undefined ? [] : [value])
      .map((address) => address.text)
      .join(', ');
  return {
    file,
    to: addresses(parsed.to),
    from: addresses(parsed.from),
    subject: parsed.subject ?? '',
    text: (parsed.text ?? '').replace(/\r\n/g, '\n'),
    raw,
  };
}
