/**
 * Reads the invitation link out of the messages that Gyre's local mail capture keeps as
 * `.eml` files in DATA_DIR/mail (used when no SMTP_URL is set). The demo accounts are
 * activated the way a person would: by following the link in their invitation.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const POLL_MS = 100;

/** The body text of an RFC 5322 message: quoted-printable and base64 decoded, soft breaks joined. */
export function messageText(raw: string): { to: string; text: string } {
  const split = raw.search(/\r?\n\r?\n/);
  const headerText = raw.slice(0, split).replace(/\r?\n[ \t]+/g, ' ');
  const body = raw.slice(split).replace(/^\r?\n\r?\n/, '');
  const header = (name: string): string =>
    new RegExp(`^${name}:\\s*(.*)$`, 'im').exec(headerText)?.[1]?.trim() ?? '';
  const encoding = header('Content-Transfer-Encoding').toLowerCase();
  let text = body;
  if (encoding === 'quoted-printable') {
    const bytes = body
      .replace(/=\r?\n/g, '')
      .replace(/=([0-9A-Fa-f]{2})/g, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16)));
    text = Buffer.from(bytes, 'latin1').toString('utf8');
  } else if (encoding === 'base64') {
    text = Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
  }
  return { to: header('To'), text };
}

/** The `token` of the first `<route>?token=` link in the text, or null. */
export function linkToken(text: string, route: string): string | null {
  const escaped = route.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
  const match = new RegExp(`${escaped}\\?token=([A-Za-z0-9_%.~-]+)`).exec(text);
  return match === null ? null : decodeURIComponent(match[1]);
}

/**
 * Waits for the newest message to `to` holding a `route` link and returns its token.
 * Throws after `timeoutMs` with what to do when no local capture is running.
 */
export async function waitForLinkToken(options: {
  mailDir: string;
  to: string;
  route: string;
  timeoutMs?: number;
}): Promise<string> {
  const deadline = Date.now() + (options.timeoutMs ?? 20_000);
  const to = options.to.toLowerCase();
  for (;;) {
    let names: string[];
    try {
      names = readdirSync(options.mailDir).filter((n) => n.endsWith('.eml'));
    } catch {
      names = [];
    }
    // Newest first: the file names start with the time the message arrived.
    for (const name of names.sort().reverse()) {
      const { to: recipient, text } = messageText(
        readFileSync(join(options.mailDir, name), 'utf8'),
      );
      if (!recipient.toLowerCase().includes(to)) continue;
      const token = linkToken(text, options.route);
      if (token !== null) return token;
    }
    if (Date.now() > deadline) {
      throw new Error(
        `No invitation e-mail to ${options.to} arrived in ${options.mailDir}. The demo accounts are ` +
          'activated from the messages of the local mail capture: run the demo without SMTP_URL.',
      );
    }
    await new Promise((resolve) => setTimeout(resolve, POLL_MS));
  }
}
