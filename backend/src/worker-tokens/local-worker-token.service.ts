import { Inject, Injectable, Logger, OnApplicationBootstrap } from '@nestjs/common';
import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { WorkerTokensService } from './worker-tokens.service';

/** Where the local worker token is written, relative to DATA_DIR. */
export const LOCAL_WORKER_TOKEN_FILE = 'worker-token';

/**
 * At every start the server revokes its previous local worker token and writes a new one to
 * `DATA_DIR/worker-token` (mode 600), for `npm run worker` on the same machine: a copy of the
 * file that leaks is worth nothing after the next restart (docs/security.md, "Worker tokens").
 */
@Injectable()
export class LocalWorkerTokenService implements OnApplicationBootstrap {
  private readonly logger = new Logger('WorkerTokens');
  readonly file: string;

  constructor(
    @Inject(APP_CONFIG) config: AppConfig,
    private readonly tokens: WorkerTokensService,
  ) {
    this.file = join(config.dataDir, LOCAL_WORKER_TOKEN_FILE);
  }

  // After every module's init: migrations applied, the audit anchors open.
  async onApplicationBootstrap(): Promise<void> {
    const token = await this.tokens.replaceLocal();
    writePrivateFile(this.file, `${token}\n`);
    this.logger.log(`Wrote a new local worker token to ${this.file}; the previous one is revoked`);
  }
}

/**
 * Writes a new file next to `file` (created 600, flushed) and renames it into place, so that a
 * worker reading meanwhile sees the old token or the new one, never half of one, and the mode
 * is 600 even when an older file had other bits.
 */
export function writePrivateFile(file: string, content: string): void {
  const temporary = `${file}.new`;
  rmSync(temporary, { force: true });
  const fd = openSync(temporary, 'wx', 0o600);
  try {
    writeSync(fd, content);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
  renameSync(temporary, file);
}
