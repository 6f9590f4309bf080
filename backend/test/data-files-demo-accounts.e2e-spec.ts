/**
 * Demo passwords live in DATA_DIR/demo-accounts.txt (mode 600) and nowhere else: what is
 * printed for the log names the accounts and the file, never a password (OWASP ASVS 4.0
 * 7.1.1: no credentials in logs). Generated credentials of invented demo people.
 */
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  DemoCredential,
  formatAccounts,
  formatAccountsForLog,
  generatePassword,
  writeAccountsFile,
} from '../../seed/src/seeder/demo-accounts-file';

const CREDENTIALS: DemoCredential[] = [
  {
    role: 'admin',
    email: 'admin@demo.invalid',
    displayName: 'Invented Admin',
    siteKey: null,
    siteName: null,
    password: generatePassword(),
  },
  {
    role: 'technician',
    email: 'tech.cedar@demo.invalid',
    displayName: 'Invented Technician',
    siteKey: 'CDR',
    siteName: 'Cedar Unit',
    password: generatePassword(),
  },
];

describe('demo accounts: passwords in the mode-600 file only', () => {
  let dataDir: string;
  beforeAll(() => {
    dataDir = mkdtempSync(join(tmpdir(), 'gyre-demo-accounts-'));
  });
  afterAll(() => {
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('the file keeps every password and is readable by its owner only (600)', () => {
    const file = writeAccountsFile(dataDir, formatAccounts(CREDENTIALS, 'http://gyre.test'));
    expect(statSync(file).mode & 0o777).toBe(0o600);
    const text = readFileSync(file, 'utf8');
    for (const c of CREDENTIALS) expect(text).toContain(c.password);
  });

  it('the text for the log names each account and the file, and holds no password', () => {
    const file = join(dataDir, 'demo-accounts.txt');
    const text = formatAccountsForLog(CREDENTIALS, 'http://gyre.test', file);
    for (const c of CREDENTIALS) {
      expect(text).toContain(c.email);
      expect(text).toContain(c.role);
      expect(text).not.toContain(c.password);
    }
    expect(text).toContain(file);
    expect(text).not.toMatch(/password\s*$/m);
  });
});
