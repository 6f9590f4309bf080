/**
 * The recording-pipeline migration on a database written by the version before it: rows of
 * the old recording, job, settings and run tables survive with their meaning, a visit that
 * held two current resting recordings keeps the newest, and the foreign keys hold.
 */
import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { RecordingPipeline1764700000000 } from '../src/database/migrations/1764700000000-recording-pipeline';
import { parseStoredSettings } from '../src/analysis/settings-values';
import { DEFAULT_ANALYSIS_SETTINGS } from '../src/signal/pipeline/analysis-settings';
import { MigrationDatabase } from './helpers/migration-database';
import { seedDatabase } from './helpers/seed';

describe('migration RecordingPipeline1764700000000', () => {
  let db: MigrationDatabase;
  let dataSource: DataSource;

  beforeAll(async () => {
    db = await MigrationDatabase.before(RecordingPipeline1764700000000);
    dataSource = db.dataSource;
  });
  afterAll(async () => {
    await db.close();
  });

  it('carries the old rows over and supersedes the older of two current resting recordings', async () => {
    const seed = await seedDatabase(dataSource);
    const visit = seed.visits.A1;
    const technician = seed.users.technician.id;
    const q = (sql: string, params: unknown[] = []): Promise<unknown> =>
      dataSource.query(sql, params);
    const settingsId = randomUUID();
    await q(
      `INSERT INTO "analysis_settings" VALUES (?, ?, 1, NULL, NULL, 'filter', 7, -1, 2, -0.5, 0, 0.2, 0.8, 100, -0.2, ?, NULL, 'defaults', NULL, '2026-01-01T00:00:00.000Z')`,
      [settingsId, visit.studyId, JSON.stringify(DEFAULT_ANALYSIS_SETTINGS.roi)],
    );
    const recording = (id: string, kind: string, createdAt: string) =>
      q(
        `INSERT INTO "recording" ("id", "studyId", "siteId", "participantId", "visitId", "kind", "state", "checksumSha256", "sizeBytes", "storedFile", "uploadedById", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, ?, ?, 'ready', ?, 100, ?, ?, ?, ?)`,
        [
          id,
          visit.studyId,
          visit.siteId,
          visit.participantId,
          visit.id,
          kind,
          id.replace(/-/g, '').padEnd(64, '0'),
          `${id}.edf`,
          technician,
          createdAt,
          createdAt,
        ],
      );
    const [older, newer, task] = [randomUUID(), randomUUID(), randomUUID()];
    await recording(older, 'resting', '2026-01-01T10:00:00.000Z');
    await recording(newer, 'resting', '2026-01-01T11:00:00.000Z');
    await recording(task, 'task', '2026-01-01T12:00:00.000Z');
    const jobId = randomUUID();
    await q(
      `INSERT INTO "job" VALUES (?, ?, ?, 'done', 1, 3, 100, NULL, ?, '2026-01-01T12:00:00.000Z', NULL, NULL)`,
      [jobId, task, settingsId, technician],
    );
    const runId = randomUUID();
    await q(
      `INSERT INTO "analysis_run" ("id", "recordingId", "visitId", "participantId", "studyId", "siteId", "jobId", "kind", "settingsId", "settingsVersion", "codeVersion", "inputChecksumSha256", "bandLowHz", "bandHighHz", "bandSource", "summaryJson", "series", "createdAt") VALUES (?, ?, ?, ?, ?, ?, ?, 'task', ?, 1, '0.1.0', 'x', 7, 11, 'iaf', '{}', x'00', '2026-01-01T12:01:00.000Z')`,
      [runId, task, visit.id, visit.participantId, visit.studyId, visit.siteId, jobId, settingsId],
    );

    expect(await db.migrate()).toBe(true);

    const rows = (await q(
      `SELECT "id", "state", "supersededById", "latestRunId" FROM "recording" ORDER BY "createdAt"`,
    )) as Array<Record<string, string | null>>;
    expect(rows).toEqual([
      { id: older, state: 'superseded', supersededById: newer, latestRunId: null },
      { id: newer, state: 'ready', supersededById: null, latestRunId: null },
      { id: task, state: 'ready', supersededById: null, latestRunId: runId },
    ]);
    const [job] = (await q(
      `SELECT "lane", "subjectId", "payloadJson", "state" FROM "job"`,
    )) as Array<Record<string, string>>;
    expect(job).toMatchObject({ lane: 'analysis', subjectId: task, state: 'done' });
    expect(JSON.parse(job.payloadJson)).toEqual({
      recordingId: task,
      trigger: 'upload',
      requestedById: technician,
      reason: null,
    });
    const [settings] = (await q(`SELECT "valuesJson" FROM "analysis_settings"`)) as Array<{
      valuesJson: string;
    }>;
    // The old columns, read back as the one settings vocabulary: Gyre's defaults.
    expect(parseStoredSettings(settings.valuesJson)).toEqual(DEFAULT_ANALYSIS_SETTINGS);
    const [run] = (await q(
      `SELECT "settingsJson", "iafHz", "trigger" FROM "analysis_run"`,
    )) as Array<{ settingsJson: string; iafHz: number; trigger: string }>;
    expect(parseStoredSettings(run.settingsJson)).toEqual(DEFAULT_ANALYSIS_SETTINGS);
    // An IAF band of 7–11 Hz was built around 9 Hz.
    expect(run).toMatchObject({ iafHz: 9, trigger: 'upload' });
    expect(await q('PRAGMA foreign_key_check')).toEqual([]);
    expect(await q('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }]);
    // At most one current recording of a kind per visit from now on.
    await expect(
      q(`UPDATE "recording" SET "state" = 'ready', "supersededById" = NULL WHERE "id" = ?`, [
        older,
      ]),
    ).rejects.toThrow(/UNIQUE/);
  });
});
