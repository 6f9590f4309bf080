import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The name the technician's file had when it was uploaded, so Intake can show which file a
 * row is. Rows from before this migration have none (null). A file name may hold personal
 * data: it is read only through the recording's site/study row scope (docs/security.md).
 */
export class RecordingFileName1764700600000 implements MigrationInterface {
  name = 'RecordingFileName1764700600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "recording" ADD COLUMN "fileName" varchar(255)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "recording" DROP COLUMN "fileName"`);
  }
}
