import { spawn } from 'node:child_process';
import { join, resolve } from 'node:path';
import type { Role } from '@gyre/shared';
import { tokenFromMail, waitForMail } from '../../../backend/test/helpers/mail-catcher';

const REPO_ROOT = resolve(import.meta.dirname, '..', '..', '..');

/** Generated test password; long enough for the policy and on no common list. */
export const E2E_PASSWORD = 'quiet-river-stone-81';

/** `POST`/`GET` against the running server with a bearer token; throws with the body on failure. */
export async function api<T>(
  baseUrl: string,
  token: string | null,
  method: string,
  path: string,
  body?: unknown,
): Promise<T> {
  const response = await fetch(`${baseUrl}${path}`, {
    method,
    headers: {
      accept: 'application/json',
      ...(body === undefined ? {} : { 'content-type': 'application/json' }),
      ...(token === null ? {} : { authorization: `Bearer ${token}` }),
    },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await response.text();
  if (!response.ok) throw new Error(`${method} ${path} answered ${response.status}: ${text}`);
  return (text.length > 0 ? JSON.parse(text) : null) as T;
}

export async function signInApi(baseUrl: string, email: string, password: string): Promise<string> {
  const session = await api<{ accessToken: string }>(baseUrl, null, 'POST', '/api/auth/sign-in', {
    email,
    password,
  });
  return session.accessToken;
}

/**
 * The product's own way to open an empty installation: `create-first-admin.js` reads the
 * account as JSON on stdin and writes it into DATA_DIR.
 */
export async function createFirstAdmin(
  dataDir: string,
  admin: { email: string; name: string; password: string },
): Promise<void> {
  const child = spawn(
    process.execPath,
    [join(REPO_ROOT, 'backend', 'dist', 'demo', 'create-first-admin.js')],
    {
      cwd: REPO_ROOT,
      env: { ...process.env, NODE_ENV: 'test', DATA_DIR: dataDir },
      stdio: ['pipe', 'pipe', 'pipe'],
    },
  );
  let output = '';
  child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stdin.end(JSON.stringify(admin));
  const code = await new Promise<number | null>((done) => child.once('exit', done));
  if (code !== 0) throw new Error(`create-first-admin exited with ${code}: ${output}`);
}

export interface Invitee {
  email: string;
  name: string;
  role: Role;
  studyId?: string;
  siteId?: string;
}

/** The single-use token of the invitation mailed to `email` (the fake SMTP server's copy). */
export async function invitationToken(dataDir: string, email: string): Promise<string> {
  const mail = await waitForMail(join(dataDir, 'mail'), { to: email, subject: /invited/i }, 20_000);
  return tokenFromMail(mail, '/accept-invite');
}

export async function resetToken(dataDir: string, email: string): Promise<string> {
  const mail = await waitForMail(join(dataDir, 'mail'), { to: email, subject: /reset/i }, 20_000);
  return tokenFromMail(mail, '/reset-password');
}

/** Invites through the API as the admin and accepts through the API with the mailed token. */
export async function inviteAndAccept(
  baseUrl: string,
  dataDir: string,
  adminToken: string,
  invitee: Invitee,
): Promise<void> {
  await api(baseUrl, adminToken, 'POST', '/api/users/invitations', invitee);
  const token = await invitationToken(dataDir, invitee.email);
  await api(baseUrl, null, 'POST', '/api/auth/accept-invitation', {
    token,
    password: E2E_PASSWORD,
  });
}
