import {
  BeforeApplicationShutdown,
  Inject,
  Injectable,
  Logger,
  OnApplicationShutdown,
  OnModuleInit,
  Optional,
} from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { createReadStream } from 'node:fs';
import type { Readable } from 'node:stream';
import { DataSource } from 'typeorm';
import type { AuditAnchorsCheck } from '@gyre/shared';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { AnchorFinding, readAnchors } from './audit-anchor-check';
import {
  AnchorReason,
  anchorPaths,
  appendLine,
  lineHash,
  readLastLine,
  readLines,
  signatureHolds,
  signedLine,
} from './audit-anchor-file';
import { AnchorKey, loadOrCreateAnchorKey } from './audit-anchor-key';
import { AnchorSettings, anchorSettingsFrom } from './audit-anchor-settings';
import { GENESIS_HASH } from './audit-chain';
import { compareInSnapshot, fileHasContent } from './audit-verify';
import { isBusyError, openSqliteFile, SqliteFile } from './sqlite-file';

type Outcome = 'written' | 'unchanged' | 'busy';

/**
 * Anchors the audit chain outside the database: signed checkpoints (newest sequence number,
 * its hash, the time) appended to `DATA_DIR/audit-anchors.jsonl`, every N entries, every M
 * seconds while entries arrive, and at clean shutdown (docs/security.md, "Anchoring the audit
 * trail"). Reads go through a connection of its own, which sees committed entries only.
 */
@Injectable()
export class AuditAnchorService
  implements OnModuleInit, BeforeApplicationShutdown, OnApplicationShutdown
{
  private readonly logger = new Logger('AuditAnchors');
  readonly settings: AnchorSettings = anchorSettingsFrom(process.env);
  readonly anchorFile: string;
  private readonly keyFile: string;
  private key: AnchorKey | null = null;
  private db: SqliteFile | null = null;
  private timer: NodeJS.Timeout | null = null;
  /** Newest sequence number this process knows to be anchored. */
  private anchoredSeq = 0;
  private entriesCheckpointPending = false;
  private queue: Promise<unknown> = Promise.resolve();
  private warnedBehind = -1;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    // Injected so that TypeORM has opened the file and run the migrations before we read it.
    @InjectDataSource() _dataSource: DataSource,
    // Absent in contexts without it (the first-admin command); anchors then write directly.
    @Optional() private readonly writes?: WriteTransactionsService,
  ) {
    ({ anchorFile: this.anchorFile, keyFile: this.keyFile } = anchorPaths(config.dataDir));
  }

  async onModuleInit(): Promise<void> {
    this.key = loadOrCreateAnchorKey(this.keyFile);
    this.db = openSqliteFile(this.config.databaseFile, { fileMustExist: true, timeout: 0 });
    this.logger.log(
      `${this.key.generated ? 'Generated the' : 'Using the'} audit anchor key ${this.keyFile} (public key SHA-256 ${this.key.fingerprint})`,
    );
    const last = readLastLine(this.anchorFile);
    if (last === null) {
      await this.checkpoint(this.key.generated ? 'key-created' : 'file-missing', true);
    } else if (last.line !== null && signatureHolds(last.line, this.key.publicKey)) {
      this.anchoredSeq = last.line.seq;
    } else if (this.key.generated) {
      this.logger.error(
        `A new audit anchor key was created although ${this.anchorFile} has ${last.n} lines: they cannot be checked with it (GET /api/audit/verify reports them)`,
      );
    }
    this.timer = setInterval(
      () => this.checkpointLogged('interval'),
      this.settings.everySeconds * 1000,
    );
    this.timer.unref();
  }

  /** Called by AuditService after each append: a checkpoint once N entries are unanchored. */
  noteAppended(seq: number): void {
    if (this.db === null || this.entriesCheckpointPending) return;
    if (seq - this.anchoredSeq < this.settings.everyEntries) return;
    this.entriesCheckpointPending = true;
    // After the current task: the entry's own transaction is ahead of us in the write queue.
    setImmediate(() => {
      this.entriesCheckpointPending = false;
      this.checkpointLogged('entries');
    });
  }

  // From timers: a failed write (disk full, permissions) is logged, never an unhandled rejection.
  private checkpointLogged(reason: AnchorReason): void {
    this.checkpoint(reason).catch((error: unknown) => {
      this.logger.error(`The ${reason} checkpoint of the audit trail failed: ${String(error)}`);
    });
  }

  /**
   * Writes a checkpoint of the newest committed entry unless it is already anchored (or
   * `force`). Resolves true when a line was written. In-process calls run one at a time.
   */
  checkpoint(reason: AnchorReason, force = false): Promise<boolean> {
    const next = this.queue.then(() => this.checkpointWithRetry(reason, force));
    this.queue = next.catch(() => undefined);
    return next;
  }

  async beforeApplicationShutdown(): Promise<void> {
    if (this.timer !== null) clearInterval(this.timer);
    this.timer = null;
    // After every onModuleDestroy (computations have stopped); TypeORM is still open.
    if (this.db === null) return;
    await this.checkpoint('shutdown').catch((error: unknown) => {
      this.logger.error(`The shutdown checkpoint of the audit trail failed: ${String(error)}`);
    });
  }

  async onApplicationShutdown(): Promise<void> {
    await this.queue;
    this.db?.close();
    this.db = null;
  }

  /** The anchor file checked line by line, then against the committed table. */
  async check(): Promise<{ check: AuditAnchorsCheck; finding: AnchorFinding | null }> {
    const { key, db } = this.ready();
    // The file first: each of its lines names only entries committed before it was written.
    const read = await readAnchors(readLines(this.anchorFile), {
      publicKey: key.publicKey,
      fileExists: fileHasContent(this.anchorFile),
    });
    return compareInSnapshot(db, read);
  }

  /** The anchor file as stored, for the monitor's download (empty when missing). */
  openAnchorFile(): Readable | null {
    return fileHasContent(this.anchorFile) ? createReadStream(this.anchorFile) : null;
  }

  publicKeyPem(): string {
    return this.ready().key.publicKey.export({ type: 'spki', format: 'pem' }).toString();
  }

  keyFingerprint(): string {
    return this.ready().key.fingerprint;
  }

  private ready(): { key: AnchorKey; db: SqliteFile } {
    if (this.key === null || this.db === null) {
      throw new Error('The audit anchors are not open (before start or after shutdown)');
    }
    return { key: this.key, db: this.db };
  }

  private async checkpointWithRetry(reason: AnchorReason, force: boolean): Promise<boolean> {
    const until = Date.now() + (reason === 'interval' || reason === 'entries' ? 2_000 : 5_000);
    for (;;) {
      if (this.db === null) return false;
      const outcome =
        this.writes === undefined
          ? this.tryAppend(reason, force)
          : await this.writes.run(() => Promise.resolve(this.tryAppend(reason, force)));
      if (outcome !== 'busy') return outcome === 'written';
      if (Date.now() > until) {
        this.logger.warn(`No ${reason} checkpoint: the database stayed busy; the next one will do`);
        return false;
      }
      await new Promise((resolve) => setTimeout(resolve, 25));
    }
  }

  /**
   * Synchronous, under the database's write lock: the lock serialises appends to the file
   * across processes (the server and command-line tools), and the head cannot move meanwhile.
   */
  private tryAppend(reason: AnchorReason, force: boolean): Outcome {
    const { key, db } = this.ready();
    try {
      db.exec('BEGIN IMMEDIATE');
    } catch (error) {
      if (isBusyError(error)) return 'busy';
      throw error;
    }
    try {
      const head = (db
        .prepare(`SELECT "seq", "hash" FROM "audit_entry" ORDER BY "seq" DESC LIMIT 1`)
        .get() as { seq: number; hash: string } | undefined) ?? { seq: 0, hash: GENESIS_HASH };
      const last = readLastLine(this.anchorFile);
      const signedLast =
        last !== null && last.line !== null && signatureHolds(last.line, key.publicKey)
          ? last.line
          : null;
      // Trust only a line we can verify: a forged huge `seq` must not stop anchoring.
      const anchored = Math.max(signedLast?.seq ?? 0, this.anchoredSeq);
      let why = reason;
      if (last === null && reason !== 'key-created') why = 'file-missing';
      else if (!force && head.seq <= anchored) {
        if (head.seq < anchored && this.warnedBehind !== head.seq) {
          this.warnedBehind = head.seq;
          this.logger.error(
            `The audit trail ends at #${head.seq} but #${anchored} was anchored: entries were deleted (see GET /api/audit/verify)`,
          );
        }
        return 'unchanged';
      }
      const line = signedLine(
        {
          v: 1,
          n: (last?.n ?? 0) + 1,
          seq: head.seq,
          hash: head.hash,
          at: nowIso(),
          reason: why,
          prev: last === null ? GENESIS_HASH : lineHash(last.raw),
          key: key.fingerprint,
        },
        key.privateKey,
      );
      appendLine(this.anchorFile, line);
      this.anchoredSeq = head.seq;
      return 'written';
    } finally {
      db.exec('COMMIT');
    }
  }
}
