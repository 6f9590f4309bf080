import { existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { openSqliteFile } from '../audit/sqlite-file';
import { scratchFolder } from '../signal/testing/scratch-folder';
import { BackupError, createBackup } from './backup';
import { hashFile } from './backup-files';
import { type BackupManifest, DATABASE_FILE, MANIFEST_FILE } from './backup-manifest';
import { restoreBackup } from './restore';

// A damaged database is refused by backup and by restore (`PRAGMA integrity_check`, which
// names what it found; https://www.sqlite.org/pragma.html#pragma_integrity_check), and what
// was refused is never left looking complete.
describe('backup and restore of a damaged database', () => {
  const scratch = scratchFolder('gyre-backup-integrity-');
  afterAll(() => scratch.remove());

  /** A small database with the table the backup reads its audit head from. */
  function database(file: string): void {
    const db = openSqliteFile(file);
    db.exec(`CREATE TABLE "audit_entry" ("seq" INTEGER, "hash" TEXT);
      CREATE TABLE "t" ("a" INTEGER, "b" INTEGER); CREATE INDEX "t_a" ON "t" ("a");
      INSERT INTO "audit_entry" VALUES (1, 'h1');`);
    const insert = db.prepare('INSERT INTO "t" VALUES (?, ?)');
    for (let i = 0; i < 50; i++) insert.run(i, 100 - i);
    db.close();
  }

  /** Points the index at the other column without rebuilding it: every row is missing from it. */
  function damage(file: string): void {
    const db = openSqliteFile(file);
    (db as unknown as { unsafeMode(on: boolean): void }).unsafeMode(true);
    db.pragma('writable_schema = ON');
    db.prepare(
      `UPDATE "sqlite_master" SET "sql" = 'CREATE INDEX "t_a" ON "t" ("b")' WHERE "name" = 't_a'`,
    ).run();
    db.close();
  }

  const INTEGRITY_FAILURE = /fails PRAGMA integrity_check: row \d+ missing from index t_a/;

  it('refuses to back up a damaged database and writes no manifest', async () => {
    const dataDir = join(scratch.dir, 'damaged-data');
    mkdirSync(dataDir);
    database(join(dataDir, DATABASE_FILE));
    damage(join(dataDir, DATABASE_FILE));
    const outDir = join(scratch.dir, 'damaged-backup');
    const attempt = createBackup({ dataDir, outDir });
    await expect(attempt).rejects.toBeInstanceOf(BackupError);
    await expect(attempt).rejects.toMatchObject({
      kind: 'failed',
      problems: [expect.stringMatching(/^The database copy /)],
    });
    await expect(attempt).rejects.toThrow(INTEGRITY_FAILURE);
    // A folder without its manifest is an unfinished backup, which restore refuses.
    expect(existsSync(join(outDir, MANIFEST_FILE))).toBe(false);
  });

  it('refuses to restore a backup whose database is damaged and leaves no data folder', async () => {
    const dataDir = join(scratch.dir, 'healthy-data');
    mkdirSync(dataDir);
    database(join(dataDir, DATABASE_FILE));
    const backupDir = join(scratch.dir, 'healthy-backup');
    const { manifest } = await createBackup({ dataDir, outDir: backupDir });
    // Damaged after the backup, with a manifest that matches the damaged file.
    damage(join(backupDir, DATABASE_FILE));
    const rehashed: BackupManifest = {
      ...manifest,
      files: await Promise.all(
        manifest.files.map(async (file) =>
          file.path === DATABASE_FILE
            ? { path: file.path, ...(await hashFile(join(backupDir, DATABASE_FILE))) }
            : file,
        ),
      ),
    };
    writeFileSync(join(backupDir, MANIFEST_FILE), JSON.stringify(rehashed));

    const target = join(scratch.dir, 'restored');
    const attempt = restoreBackup({ backupDir, dataDir: target });
    await expect(attempt).rejects.toMatchObject({
      kind: 'failed',
      problems: [expect.stringMatching(/^The restored database /)],
    });
    await expect(attempt).rejects.toThrow(INTEGRITY_FAILURE);
    expect(existsSync(target)).toBe(false);
    expect(readdirSync(scratch.dir).filter((name) => name.includes('.restoring-'))).toEqual([]);
  });
});
