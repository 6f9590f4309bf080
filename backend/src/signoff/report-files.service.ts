import { createHash, randomUUID } from 'node:crypto';
import { mkdir, readFile, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { Inject, Injectable } from '@nestjs/common';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { SignoffError, signoffError } from './signoff.errors';

export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/**
 * Signed PDFs on disk under `<DATA_DIR>/reports/<sha256>.pdf`: named by their content, written
 * once (temporary file, then rename), and checked against the name on every read.
 */
@Injectable()
export class ReportFilesService {
  readonly dir: string;

  constructor(@Inject(APP_CONFIG) config: AppConfig) {
    this.dir = join(config.dataDir, 'reports');
  }

  pathOf(sha256: string): string {
    if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error(`Not a SHA-256: ${sha256}`);
    return join(this.dir, `${sha256}.pdf`);
  }

  /** Stores the bytes; returns their SHA-256. A file of that name already holds them. */
  async store(bytes: Buffer): Promise<string> {
    const sha256 = sha256Hex(bytes);
    const path = this.pathOf(sha256);
    await mkdir(this.dir, { recursive: true });
    if (await exists(path)) return sha256;
    const temporary = join(this.dir, `.incoming-${randomUUID()}`);
    await writeFile(temporary, bytes, { flag: 'wx', mode: 0o440 });
    try {
      await rename(temporary, path);
    } catch (error) {
      await unlink(temporary).catch(() => undefined);
      throw error;
    }
    return sha256;
  }

  /** The stored bytes, refused if they no longer hash to their recorded SHA-256. */
  async read(sha256: string): Promise<Buffer> {
    const bytes = await readFile(this.pathOf(sha256));
    const actual = sha256Hex(bytes);
    if (actual !== sha256) {
      throw signoffError(
        SignoffError.FileCorrupted,
        `The stored report file does not match its recorded SHA-256 (recorded ${sha256}, found ${actual}); it is not served.`,
        { recordedSha256: sha256, actualSha256: actual },
      );
    }
    return bytes;
  }
}

async function exists(path: string): Promise<boolean> {
  try {
    await stat(path);
    return true;
  } catch {
    return false;
  }
}
