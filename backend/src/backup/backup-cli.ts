/**
 * `npm run backup [-- --out DIR] [--data-dir DIR] [--include-mail]` — a consistent copy of the
 * data folder (DATA_DIR, default ./data) while Gyre may be running: the database through
 * SQLite's online backup API, the stored files, and a manifest of their SHA-256 checksums.
 * Default folder: ./backups/gyre-backup-<UTC time>. Exit codes: 0 written, 1 failed,
 * 2 wrong arguments, 3 refused (no database, or the target folder is not empty).
 */
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { createBackup } from './backup';
import { runCommand } from './run-command';
import { errorMessage } from '../common/errors/error-message';

const USAGE =
  'Usage: npm run backup [-- --out DIR] [--data-dir DIR] [--include-mail]\n' +
  '  --out DIR        a new or empty folder (default ./backups/gyre-backup-<time>)\n' +
  '  --data-dir DIR   the data folder (default DATA_DIR, else ./data)\n' +
  '  --include-mail   also copy mail/ (captured e-mail)\n';

async function main(argv: string[]): Promise<number> {
  let values: { out?: string; 'data-dir'?: string; 'include-mail'?: boolean; help?: boolean };
  try {
    ({ values } = parseArgs({
      args: argv,
      options: {
        out: { type: 'string' },
        'data-dir': { type: 'string' },
        'include-mail': { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
      strict: true,
      allowPositionals: false,
    }));
  } catch (error) {
    process.stderr.write(`${errorMessage(error)}\n${USAGE}`);
    return 2;
  }
  if (values.help === true) {
    process.stdout.write(USAGE);
    return 0;
  }
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  const outDir = resolve(values.out ?? join('backups', `gyre-backup-${stamp}`));
  const dataDir = resolve(values['data-dir'] ?? process.env.DATA_DIR ?? './data');
  const { manifest } = await createBackup({
    dataDir,
    outDir,
    includeMail: values['include-mail'] === true,
  });
  const bytes = manifest.files.reduce((sum, file) => sum + file.bytes, 0);
  const head = manifest.database.auditHead;
  process.stdout.write(
    [
      `Backup of ${dataDir} written to ${outDir}`,
      `  database: online copy, integrity check ok, audit trail up to #${head?.seq ?? 0}`,
      `  files: ${manifest.files.length} (${bytes} bytes), each with its SHA-256 in manifest.json`,
      ...manifest.skipped.map((s) => `  left out: ${s.path} (${s.why})`),
      '',
    ].join('\n'),
  );
  return 0;
}

runCommand('Backup', () => main(process.argv.slice(2)));
