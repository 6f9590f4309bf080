/**
 * `npm run restore -- BACKUP_DIR --data-dir NEWDIR` — checks a backup against its manifest
 * (SHA-256 of every file, nothing unlisted) and restores it into a new or empty data folder,
 * refusing one with anything in it. Then checks the database and the audit trail (chain and
 * signed checkpoints). Exit codes: 0 restored, 1 failed, 2 wrong arguments, 3 refused (the
 * backup does not verify, or the target is not empty), 4 restored but the audit trail does not
 * verify (said on stderr). With 1, 2 or 3 nothing is written.
 */
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { restoreBackup } from './restore';
import { runCommand } from './run-command';
import { errorMessage } from '../common/errors/error-message';

const USAGE =
  'Usage: npm run restore -- BACKUP_DIR --data-dir NEWDIR\n' +
  '  BACKUP_DIR       a folder written by npm run backup\n' +
  '  --data-dir DIR   the data folder to create (missing or empty)\n';

async function main(argv: string[]): Promise<number> {
  let parsed: { values: { 'data-dir'?: string; help?: boolean }; positionals: string[] };
  try {
    parsed = parseArgs({
      args: argv,
      options: { 'data-dir': { type: 'string' }, help: { type: 'boolean', short: 'h' } },
      strict: true,
      allowPositionals: true,
    });
  } catch (error) {
    process.stderr.write(`${errorMessage(error)}\n${USAGE}`);
    return 2;
  }
  if (parsed.values.help === true) {
    process.stdout.write(USAGE);
    return 0;
  }
  const target = parsed.values['data-dir'];
  if (parsed.positionals.length !== 1 || target === undefined) {
    process.stderr.write(
      `${parsed.positionals.length !== 1 ? 'One BACKUP_DIR expected' : '--data-dir missing'}\n${USAGE}`,
    );
    return 2;
  }
  const result = await restoreBackup({
    backupDir: resolve(parsed.positionals[0]),
    dataDir: resolve(target),
  });
  const { audit } = result;
  process.stdout.write(
    [
      `Restored ${result.manifest.files.length} files (checksums verified) from the backup of ${result.manifest.createdAt} into ${result.dataDir}`,
      `  database: integrity check ok`,
      `  audit trail: ${audit.intact ? 'intact' : 'DOES NOT VERIFY'}, ${audit.checked} entries checked, ${audit.anchors.checkpoints} signed checkpoints read`,
      `  start Gyre with DATA_DIR=${result.dataDir}`,
      '',
    ].join('\n'),
  );
  if (!audit.intact) {
    const findings = [
      ...(audit.firstBroken === null
        ? []
        : [`entry #${audit.firstBroken.seq}: ${audit.firstBroken.reason}`]),
      ...audit.anchors.problems,
    ];
    process.stderr.write(
      `The restored audit trail does not verify (the backup holds it as it was):\n${findings.map((f) => `  - ${f}\n`).join('')}`,
    );
  }
  return audit.intact ? 0 : 4;
}

runCommand('Restore', () => main(process.argv.slice(2)));
