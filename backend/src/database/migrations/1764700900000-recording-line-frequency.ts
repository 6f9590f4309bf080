import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The power line frequency a recording's source declared (50 or 60 Hz; EEG-BIDS
 * `PowerLineFrequency`), so Review applies that line-noise check alone. Rows from before this
 * migration, and plain uploads, have none (null): both checks are shown.
 */
export class RecordingLineFrequency1764700900000 implements MigrationInterface {
  name = 'RecordingLineFrequency1764700900000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "recording" ADD COLUMN "lineFrequencyHz" integer`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "recording" DROP COLUMN "lineFrequencyHz"`);
  }
}
