import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * EEG-BIDS import: one row per imported recording with its path in the uploaded folder, task,
 * power line frequency and the channels its channels.tsv marked bad.
 */
export class BidsImportFiles1764700700000 implements MigrationInterface {
  name = 'BidsImportFiles1764700700000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "bids_import_file" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "importId" varchar(36) NOT NULL,
      "recordingId" varchar(36) NOT NULL REFERENCES "recording" ("id") ON DELETE RESTRICT,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "studyId" varchar(36) NOT NULL,
      "siteId" varchar(36) NOT NULL,
      "path" varchar(1000) NOT NULL,
      "task" varchar(200) NOT NULL,
      "taskName" varchar(200),
      "lineFrequencyHz" integer,
      "badChannelsJson" text NOT NULL,
      "importedById" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "createdAt" varchar(30) NOT NULL
    )`);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "UQ_bids_import_file_recording" ON "bids_import_file" ("recordingId")`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_bids_import_file_import" ON "bids_import_file" ("importId")`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "bids_import_file"`);
  }
}
