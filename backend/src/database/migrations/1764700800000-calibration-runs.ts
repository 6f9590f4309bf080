import { MigrationInterface, QueryRunner } from 'typeorm';

/** A site's calibration runs (calibration/), in a table of their own, apart from study data. */
export class CalibrationRuns1764700800000 implements MigrationInterface {
  name = 'CalibrationRuns1764700800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "calibration_run" (
        "id" varchar(36) PRIMARY KEY NOT NULL,
        "studyId" varchar(36) NOT NULL,
        "siteId" varchar(36) NOT NULL,
        "state" varchar(16) NOT NULL,
        "signalName" varchar(64) NOT NULL,
        "settingsVersionId" varchar(36) NOT NULL,
        "settingsVersion" integer NOT NULL,
        "settingsJson" text NOT NULL,
        "gyreVersion" varchar(32) NOT NULL,
        "restSha256" varchar(64) NOT NULL,
        "taskSha256" varchar(64) NOT NULL,
        "checksJson" text NOT NULL,
        "error" text,
        "requestedById" varchar(36) NOT NULL,
        "requestedAt" varchar(30) NOT NULL,
        "finishedAt" varchar(30)
      )`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_calibration_run_site" ON "calibration_run" ("siteId", "requestedAt")`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_calibration_run_study" ON "calibration_run" ("studyId", "requestedAt")`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "calibration_run"`);
  }
}
