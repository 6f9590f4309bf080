import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Recordings, the job queue, versioned analysis settings, analysis runs (results), slowing
 * flags and visit reports. Scoped rows carry `studyId`/`siteId` copied from their visit.
 */
export class RecordingsAndAnalysis1764633800000 implements MigrationInterface {
  name = 'RecordingsAndAnalysis1764633800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "recording" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar(36) NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL REFERENCES "participant" ("id") ON DELETE RESTRICT,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "kind" varchar(16) NOT NULL CHECK ("kind" IN ('resting', 'task')),
      "state" varchar(16) NOT NULL
        CHECK ("state" IN ('received', 'queued', 'computing', 'ready', 'rejected', 'failed')),
      "checksumSha256" varchar(64) NOT NULL,
      "sizeBytes" integer NOT NULL,
      "storedFile" varchar(80),
      "factsJson" text,
      "csvOnsetsJson" text,
      "onsetsChecksumSha256" varchar(64),
      "rejectionJson" text,
      "failureMessage" text,
      "uploadedById" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL,
      CHECK (("state" = 'rejected') = ("rejectionJson" IS NOT NULL))
    )`);
    await queryRunner.query(
      `CREATE INDEX "IDX_recording_visit" ON "recording" ("visitId", "createdAt")`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_recording_study_site" ON "recording" ("studyId", "siteId")`,
    );
    // The same file twice in one visit is refused; a rejected attempt does not block a retry.
    await queryRunner.query(
      `CREATE UNIQUE INDEX "UQ_recording_visit_checksum" ON "recording" ("visitId", "checksumSha256") WHERE "state" <> 'rejected'`,
    );

    await queryRunner.query(`CREATE TABLE "analysis_settings" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "version" integer NOT NULL CHECK ("version" >= 1),
      "bandLowHz" real,
      "bandHighHz" real,
      "method" varchar(16) NOT NULL CHECK ("method" IN ('filter', 'morlet')),
      "morletCycles" real NOT NULL,
      "epochStartS" real NOT NULL,
      "epochEndS" real NOT NULL,
      "baselineStartS" real NOT NULL,
      "baselineEndS" real NOT NULL,
      "postStartS" real NOT NULL,
      "postEndS" real NOT NULL,
      "rejectionThresholdUv" real NOT NULL,
      "flagThresholdHz" real NOT NULL,
      "roiJson" text NOT NULL,
      "onsetLabel" varchar(200),
      "reason" text NOT NULL,
      "createdById" varchar(36) REFERENCES "user" ("id") ON DELETE RESTRICT,
      "createdAt" varchar(30) NOT NULL,
      CONSTRAINT "UQ_analysis_settings_version" UNIQUE ("studyId", "version"),
      CHECK (("bandLowHz" IS NULL) = ("bandHighHz" IS NULL))
    )`);

    await queryRunner.query(`CREATE TABLE "job" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "recordingId" varchar(36) NOT NULL REFERENCES "recording" ("id") ON DELETE RESTRICT,
      "settingsId" varchar(36) NOT NULL REFERENCES "analysis_settings" ("id") ON DELETE RESTRICT,
      "state" varchar(16) NOT NULL CHECK ("state" IN ('queued', 'running', 'done', 'failed')),
      "attempts" integer NOT NULL DEFAULT 0,
      "maxAttempts" integer NOT NULL DEFAULT 3,
      "progressPercent" integer NOT NULL DEFAULT 0 CHECK ("progressPercent" BETWEEN 0 AND 100),
      "error" text,
      "requestedById" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "createdAt" varchar(30) NOT NULL,
      "startedAt" varchar(30),
      "finishedAt" varchar(30)
    )`);
    await queryRunner.query(`CREATE INDEX "IDX_job_state" ON "job" ("state", "createdAt")`);
    await queryRunner.query(
      `CREATE INDEX "IDX_job_recording" ON "job" ("recordingId", "createdAt")`,
    );

    await queryRunner.query(`CREATE TABLE "analysis_run" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "recordingId" varchar(36) NOT NULL REFERENCES "recording" ("id") ON DELETE RESTRICT,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL REFERENCES "participant" ("id") ON DELETE RESTRICT,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar(36) NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "jobId" varchar(36) NOT NULL UNIQUE REFERENCES "job" ("id") ON DELETE RESTRICT,
      "kind" varchar(16) NOT NULL CHECK ("kind" IN ('resting', 'task')),
      "settingsId" varchar(36) NOT NULL REFERENCES "analysis_settings" ("id") ON DELETE RESTRICT,
      "settingsVersion" integer NOT NULL,
      "codeVersion" varchar(40) NOT NULL,
      "inputChecksumSha256" varchar(64) NOT NULL,
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
    await queryRunner.query(
      `CREATE INDEX "IDX_analysis_run_recording" ON "analysis_run" ("recordingId", "createdAt")`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_analysis_run_visit" ON "analysis_run" ("visitId", "createdAt")`,
    );

    await queryRunner.query(`CREATE TABLE "flag" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL REFERENCES "participant" ("id") ON DELETE RESTRICT,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar(36) NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "state" varchar(16) NOT NULL CHECK ("state" IN ('raised', 'cleared')),
      "raisedById" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "raiseReason" text NOT NULL CHECK (length("raiseReason") >= 10),
      "raisedAt" varchar(30) NOT NULL,
      "suggestionJson" text,
      "clearedById" varchar(36) REFERENCES "user" ("id") ON DELETE RESTRICT,
      "clearReason" text CHECK ("clearReason" IS NULL OR length("clearReason") >= 10),
      "clearedAt" varchar(30),
      CHECK (("state" = 'cleared') = ("clearedAt" IS NOT NULL))
    )`);
    await queryRunner.query(`CREATE INDEX "IDX_flag_visit" ON "flag" ("visitId", "raisedAt")`);
    // At most one raised flag per visit at a time.
    await queryRunner.query(
      `CREATE UNIQUE INDEX "UQ_flag_visit_raised" ON "flag" ("visitId") WHERE "state" = 'raised'`,
    );

    await queryRunner.query(`CREATE TABLE "report" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "visitId" varchar(36) NOT NULL UNIQUE REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL REFERENCES "participant" ("id") ON DELETE RESTRICT,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar(36) NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "state" varchar(16) NOT NULL CHECK ("state" IN ('draft', 'signed', 'sent')),
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL
    )`);
    await queryRunner.query(
      `CREATE INDEX "IDX_report_study_site" ON "report" ("studyId", "siteId", "state")`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of [
      'report',
      'flag',
      'analysis_run',
      'job',
      'analysis_settings',
      'recording',
    ]) {
      await queryRunner.query(`DROP TABLE "${table}"`);
    }
  }
}
