/**
 * Generated passwords of the demo accounts and the file that lists them,
 * DATA_DIR/demo-accounts.txt, readable by its owner only (mode 600).
 */
import { randomBytes } from 'node:crypto';
import { chmodSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { DemoAccount } from '../scenario/demo-scenario';

export const DEMO_ACCOUNTS_FILE = 'demo-accounts.txt';

export interface DemoCredential extends DemoAccount {
  password: string;
  siteName: string | null;
}

/** 20 characters from 120 random bits (base64url): far past Gyre's 12-character minimum. */
export function generatePassword(): string {
  return randomBytes(15).toString('base64url');
}

/** The accounts with their passwords as an aligned text table: for the mode-600 file only. */
export function formatAccounts(credentials: readonly DemoCredential[], signInUrl: string): string {
  return [
    'Gyre demo accounts (generated passwords; the demo study and its people are invented)',
    `Sign in at ${signInUrl}`,
    '',
    ...alignedTable(
      ['role', 'site', 'e-mail', 'password'],
      credentials.map((c) => [c.role, c.siteName ?? '—', c.email, c.password]),
    ),
    '',
  ].join('\n');
}

/** The accounts for a log or terminal, without passwords: a log has more readers than its owner. */
export function formatAccountsForLog(
  credentials: readonly DemoCredential[],
  signInUrl: string,
  accountsFile: string,
): string {
  return [
    `Gyre demo accounts (sign in at ${signInUrl}); their passwords are in ${accountsFile} (readable by its owner only)`,
    '',
    ...alignedTable(
      ['role', 'site', 'e-mail'],
      credentials.map((c) => [c.role, c.siteName ?? '—', c.email]),
    ),
    '',
  ].join('\n');
}

function alignedTable(header: string[], rows: string[][]): string[] {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]): string =>
    cells
      .map((cell, i) => cell.padEnd(widths[i]))
      .join('  ')
      .trimEnd();
  return [line(header), ...rows.map(line)];
}

/** Writes DATA_DIR/demo-accounts.txt with mode 600 (also when the file was already there). */
export function writeAccountsFile(dataDir: string, text: string): string {
  const file = join(dataDir, DEMO_ACCOUNTS_FILE);
  writeFileSync(file, text, { mode: 0o600 });
  chmodSync(file, 0o600);
  return file;
}
