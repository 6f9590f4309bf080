import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { Participant } from '../../../participants/participant.entity';

/** A temporary SQLite file for unit tests that query in SQL; `close` destroys and deletes it. */
export interface ParticipantTable {
  db: DataSource;
  close(): Promise<void>;
}

/**
 * A real SQLite file holding only the participant table: every column the entity maps (other
 * modules add columns), untyped, so that a test sees what SQL does with its query.
 */
export async function participantTable(name: string): Promise<ParticipantTable> {
  const dir = mkdtempSync(join(tmpdir(), `gyre-${name}-`));
  const db = new DataSource({
    type: 'better-sqlite3',
    database: join(dir, `${name}.sqlite`),
    entities: [Participant],
  });
  await db.initialize();
  const columns = db
    .getMetadata(Participant)
    .columns.map((c) => `"${c.databaseName}"${c.isPrimary ? ' varchar PRIMARY KEY' : ''}`);
  await db.query(`CREATE TABLE "participant" (${columns.join(', ')})`);
  return {
    db,
    close: async () => {
      await db.destroy();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
