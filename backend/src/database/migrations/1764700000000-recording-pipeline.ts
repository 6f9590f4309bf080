import { MigrationInterface, QueryRunner } from 'typeorm';

const CURRENT = `('queued', 'computing', 'ready', 'failed')`;

/**
 * The recording pipeline with one owner: recordings gain `validating` and `superseded`, an
 * explicit replacement (who replaced whom, and why), a confirmed kind and their current run;
 * the job table becomes a queue that knows nothing of recordings (lane, subject, payload);
 * settings versions and runs store the one settings vocabulary as JSON; visits get their own
 * audited analysis override. Recordings of the same kind already twice current in a visit
 * keep the newest and supersede the rest, so that at most one is current from now on.
 *
 * SQLite cannot change a CHECK constraint in place: tables are rebuilt the documented way
 * (foreign keys off, copy, swap, `foreign_key_check`), which needs to run outside TypeORM's
 * per-migration transaction.
 */
export class RecordingPipeline1764700000000 implements MigrationInterface {
  name = 'RecordingPipeline1764700000000';
  transaction = false;

  async up(q: QueryRunner): Promise<void> {
    await q.query('PRAGMA foreign_keys = OFF');
    await q.startTransaction();
    try {
      await this.rebuildRecording(q);
      await this.rebuildJob(q);
      await this.rebuildSettings(q);
      await this.rebuildRuns(q);
      await q.query(`CREATE TABLE "visit_analysis_override" (
        "id" varchar(36) PRIMARY KEY NOT NULL,
        "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
        "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
        "siteId" varchar(36) NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
        "revision" integer NOT NULL CHECK ("revision" >= 1),
        "valuesJson" text NOT NULL,
        "reason" text NOT NULL,
        "createdById" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
        "createdAt" varchar(30) NOT NULL,
        CONSTRAINT "UQ_visit_analysis_override_revision" UNIQUE ("visitId", "revision")
      )`);
      const broken: unknown[] = await q.query('PRAGMA foreign_key_check');
      if (broken.length > 0) {
        throw new Error(`foreign keys broken by the rebuild: ${JSON.stringify(broken)}`);
      }
      await q.commitTransaction();
    } catch (error) {
      await q.rollbackTransaction();
      throw error;
    } finally {
      await q.query('PRAGMA foreign_keys = ON');
    }
  }

  private async rebuildRecording(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "recording_next" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar(36) NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL REFERENCES "participant" ("id") ON DELETE RESTRICT,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "kind" varchar(16) NOT NULL CHECK ("kind" IN ('resting', 'task')),
      "state" varchar(16) NOT NULL CHECK ("state" IN ('received', 'validating', 'queued',
        'computing', 'ready', 'rejected', 'failed', 'superseded')),
      "checksumSha256" varchar(64) NOT NULL,
      "sizeBytes" integer NOT NULL,
      "storedFile" varchar(80),
      "factsJson" text,
      "csvOnsetsJson" text,
      "onsetsChecksumSha256" varchar(64),
      "rejectionJson" text,
      "kindConfirmed" boolean NOT NULL DEFAULT (0),
      "replacesId" varchar(36) REFERENCES "recording" ("id") ON DELETE RESTRICT,
      "replacementReason" text,
      "supersededById" varchar(36) REFERENCES "recording" ("id") ON DELETE RESTRICT,
      "latestRunId" varchar(36),
      "roiUsageJson" text,
      "resultWarningsJson" text,
      "failureMessage" text,
      "uploadedById" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL,
      CHECK (("state" = 'rejected') = ("rejectionJson" IS NOT NULL)),
      CHECK (("state" = 'superseded') = ("supersededById" IS NOT NULL)),
      CHECK (("replacesId" IS NULL) = ("replacementReason" IS NULL))
    )`);
    await q.query(`INSERT INTO "recording_next" ("id", "studyId", "siteId", "participantId",
        "visitId", "kind", "state", "checksumSha256", "sizeBytes", "storedFile", "factsJson",
        "csvOnsetsJson", "onsetsChecksumSha256", "rejectionJson", "latestRunId",
        "failureMessage", "uploadedById", "createdAt", "updatedAt")
      SELECT r."id", r."studyId", r."siteId", r."participantId", r."visitId", r."kind", r."state",
        r."checksumSha256", r."sizeBytes", r."storedFile", r."factsJson", r."csvOnsetsJson",
        r."onsetsChecksumSha256", r."rejectionJson",
        (SELECT a."id" FROM "analysis_run" a WHERE a."recordingId" = r."id"
          ORDER BY a."createdAt" DESC, a."id" DESC LIMIT 1),
        r."failureMessage", r."uploadedById", r."createdAt", r."updatedAt"
      FROM "recording" r`);
    // Before this version a second file of a kind was accepted silently: the newest stays current.
    await q.query(`UPDATE "recording_next" SET "state" = 'superseded',
        "supersededById" = (SELECT n."id" FROM "recording_next" n
          WHERE n."visitId" = "recording_next"."visitId" AND n."kind" = "recording_next"."kind"
            AND n."state" IN ${CURRENT}
          ORDER BY n."createdAt" DESC, n."id" DESC LIMIT 1)
      WHERE "state" IN ${CURRENT} AND EXISTS (SELECT 1 FROM "recording_next" n
          WHERE n."visitId" = "recording_next"."visitId" AND n."kind" = "recording_next"."kind"
            AND n."state" IN ${CURRENT}
            AND (n."createdAt" > "recording_next"."createdAt"
              OR (n."createdAt" = "recording_next"."createdAt" AND n."id" > "recording_next"."id")))`);
    await q.query(`DROP TABLE "recording"`);
    await q.query(`ALTER TABLE "recording_next" RENAME TO "recording"`);
    await q.query(`CREATE INDEX "IDX_recording_visit" ON "recording" ("visitId", "createdAt")`);
    await q.query(`CREATE INDEX "IDX_recording_study_site" ON "recording" ("studyId", "siteId")`);
    await q.query(
      `CREATE UNIQUE INDEX "UQ_recording_visit_checksum" ON "recording" ("visitId", "checksumSha256") WHERE "state" <> 'rejected'`,
    );
    // At most one current recording of each kind per visit; a replacement supersedes the other.
    await q.query(
      `CREATE UNIQUE INDEX "UQ_recording_visit_kind_current" ON "recording" ("visitId", "kind") WHERE "state" IN ${CURRENT}`,
    );
  }

  private async rebuildJob(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "job_next" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "lane" varchar(32) NOT NULL,
      "subjectId" varchar(36) NOT NULL,
      "payloadJson" text NOT NULL,
      "state" varchar(16) NOT NULL CHECK ("state" IN ('queued', 'running', 'done', 'failed')),
      "attempts" integer NOT NULL DEFAULT 0,
      "maxAttempts" integer NOT NULL DEFAULT 3,
      "progressPercent" integer NOT NULL DEFAULT 0 CHECK ("progressPercent" BETWEEN 0 AND 100),
      "error" text,
      "runAfter" varchar(30) NOT NULL,
      "createdAt" varchar(30) NOT NULL,
      "startedAt" varchar(30),
      "finishedAt" varchar(30)
    )`);
    await q.query(`INSERT INTO "job_next" ("id", "lane", "subjectId", "payloadJson", "state",
        "attempts", "maxAttempts", "progressPercent", "error", "runAfter", "createdAt",
        "startedAt", "finishedAt")
      SELECT "id", 'analysis', "recordingId",
        json_object('recordingId', "recordingId", 'trigger', 'upload',
          'requestedById', "requestedById", 'reason', NULL),
        "state", "attempts", "maxAttempts", "progressPercent", "error", "createdAt", "createdAt",
        "startedAt", "finishedAt"
      FROM "job"`);
    await q.query(`DROP TABLE "job"`);
    await q.query(`ALTER TABLE "job_next" RENAME TO "job"`);
    await q.query(
      `CREATE INDEX "IDX_job_lane_state" ON "job" ("lane", "state", "runAfter", "createdAt")`,
    );
    await q.query(`CREATE INDEX "IDX_job_subject" ON "job" ("subjectId", "createdAt")`);
  }

  private async rebuildSettings(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "analysis_settings_next" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "version" integer NOT NULL CHECK ("version" >= 1),
      "valuesJson" text NOT NULL CHECK (json_valid("valuesJson")),
      "reason" text NOT NULL,
      "createdById" varchar(36) REFERENCES "user" ("id") ON DELETE RESTRICT,
      "createdAt" varchar(30) NOT NULL,
      CONSTRAINT "UQ_analysis_settings_version" UNIQUE ("studyId", "version")
    )`);
    await q.query(`INSERT INTO "analysis_settings_next" ("id", "studyId", "version", "valuesJson",
        "reason", "createdById", "createdAt")
      SELECT "id", "studyId", "version",
        json_object(
          'bandHz', CASE WHEN "bandLowHz" IS NULL THEN json('null')
                         ELSE json_array("bandLowHz", "bandHighHz") END,
          'method', "method",
          'morletCycles', "morletCycles",
          'epochWindowS', json_array("epochStartS", "epochEndS"),
          'baselineWindowS', json_array("baselineStartS", "baselineEndS"),
          'postWindowS', json_array("postStartS", "postEndS"),
          'rejectionThresholdUv', "rejectionThresholdUv",
          'flagThresholdHz', "flagThresholdHz",
          'roi', json("roiJson"),
          'onsetLabel', "onsetLabel"),
        "reason", "createdById", "createdAt"
      FROM "analysis_settings"`);
    await q.query(`DROP TABLE "analysis_settings"`);
    await q.query(`ALTER TABLE "analysis_settings_next" RENAME TO "analysis_settings"`);
  }

  private async rebuildRuns(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "analysis_run_next" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "recordingId" varchar(36) NOT NULL REFERENCES "recording" ("id") ON DELETE RESTRICT,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL REFERENCES "participant" ("id") ON DELETE RESTRICT,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar(36) NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "jobId" varchar(36) NOT NULL UNIQUE REFERENCES "job" ("id") ON DELETE RESTRICT,
      "kind" varchar(16) NOT NULL CHECK ("kind" IN ('resting', 'task')),
      "trigger" varchar(16) NOT NULL DEFAULT ('upload'),
      "settingsId" varchar(36) NOT NULL REFERENCES "analysis_settings" ("id") ON DELETE RESTRICT,
      "settingsVersion" integer NOT NULL,
      "settingsJson" text NOT NULL CHECK (json_valid("settingsJson")),
      "overrideRevision" integer,
      "iafHz" real,
      "codeVersion" varchar(40) NOT NULL,
      "inputChecksumSha256" varchar(64) NOT NULL,
      "resultsSha256" varchar(64),
      "bandLowHz" real NOT NULL,
      "bandHighHz" real NOT NULL,
      "bandSource" varchar(16) NOT NULL CHECK ("bandSource" IN ('settings', 'iaf', 'default')),
      "roiDeltaFHz" real,
      "roiCiLowHz" real,
      "roiCiHighHz" real,
      "roiPValue" real,
      "trialsKept" integer,
      "trialsTotal" integer,
      "pafHz" real,
      "cogHz" real,
      "suggestsSlowing" boolean,
      "summaryJson" text NOT NULL,
      "series" blob NOT NULL,
      "createdAt" varchar(30) NOT NULL
    )`);
    await q.query(`INSERT INTO "analysis_run_next" ("id", "recordingId", "visitId",
        "participantId", "studyId", "siteId", "jobId", "kind", "trigger", "settingsId",
        "settingsVersion", "settingsJson", "overrideRevision", "iafHz", "codeVersion",
        "inputChecksumSha256", "resultsSha256", "bandLowHz", "bandHighHz", "bandSource",
        "roiDeltaFHz", "roiCiLowHz", "roiCiHighHz", "roiPValue", "trialsKept", "trialsTotal",
        "pafHz", "cogHz", "suggestsSlowing", "summaryJson", "series", "createdAt")
      SELECT r."id", r."recordingId", r."visitId", r."participantId", r."studyId", r."siteId",
        r."jobId", r."kind", 'upload', r."settingsId", r."settingsVersion",
        (SELECT s."valuesJson" FROM "analysis_settings" s WHERE s."id" = r."settingsId"),
        NULL,
        CASE WHEN r."bandSource" = 'iaf' THEN (r."bandLowHz" + r."bandHighHz") / 2 ELSE NULL END,
        r."codeVersion", r."inputChecksumSha256", NULL, r."bandLowHz", r."bandHighHz",
        r."bandSource", r."roiDeltaFHz", r."roiCiLowHz", r."roiCiHighHz", r."roiPValue",
        r."trialsKept", r."trialsTotal", r."pafHz", r."cogHz", r."suggestsSlowing",
        r."summaryJson", r."series", r."createdAt"
      FROM "analysis_run" r`);
    await q.query(`DROP TABLE "analysis_run"`);
    await q.query(`ALTER TABLE "analysis_run_next" RENAME TO "analysis_run"`);
    await q.query(
      `CREATE INDEX "IDX_analysis_run_recording" ON "analysis_run" ("recordingId", "createdAt")`,
    );
    await q.query(
      `CREATE INDEX "IDX_analysis_run_visit" ON "analysis_run" ("visitId", "createdAt")`,
    );
  }

  down(): Promise<void> {
    return Promise.reject(
      new Error('RecordingPipeline1764700000000 is not reversible: restore a backup instead.'),
    );
  }
}
