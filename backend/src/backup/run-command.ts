import { BackupError } from './backup';
import { errorMessage } from '../common/errors/error-message';

/**
 * Runs `npm run backup` or `npm run restore`: the exit code `main` gives, or after a
 * BackupError its problems one a line (exit 3 when refused, nothing written; 1 when failed).
 */
export function runCommand(name: 'Backup' | 'Restore', main: () => Promise<number>): void {
  main().then(
    (code) => {
      process.exitCode = code;
    },
    (error: unknown) => {
      if (error instanceof BackupError) {
        process.stderr.write(
          `${name} ${error.kind}:\n${error.problems.map((p) => `  - ${p}\n`).join('')}`,
        );
        process.exitCode = error.kind === 'refused' ? 3 : 1;
        return;
      }
      process.stderr.write(`${name} failed: ${errorMessage(error)}\n`);
      process.exitCode = 1;
    },
  );
}
