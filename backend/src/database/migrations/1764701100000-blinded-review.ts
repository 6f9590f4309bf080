import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Blinded review: the study's switch (off for every existing study), each visit's stored
 * random code, and each analyst's unblinding of a visit after recording their decision on it.
 */
export class BlindedReview1764701100000 implements MigrationInterface {
  name = 'BlindedReview1764701100000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE "study" ADD COLUMN "blindedReview" boolean NOT NULL DEFAULT (0)`,
    );
    await queryRunner.query(`CREATE TABLE "visit_blind_code" (
      "visitId" varchar(36) PRIMARY KEY NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "studyId" varchar(36) NOT NULL,
      "code" varchar(16) NOT NULL,
      "createdAt" varchar(30) NOT NULL
    )`);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "UQ_visit_blind_code_study_code" ON "visit_blind_code" ("studyId", "code")`,
    );
    await queryRunner.query(`CREATE TABLE "visit_unblinding" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL,
      "studyId" varchar(36) NOT NULL,
      "siteId" varchar(36) NOT NULL,
      "userId" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "decision" varchar(16) NOT NULL,
      "reason" text NOT NULL,
      "flagId" varchar(36) REFERENCES "flag" ("id") ON DELETE RESTRICT,
      "unblindedAt" varchar(30) NOT NULL
    )`);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "UQ_visit_unblinding_user_visit" ON "visit_unblinding" ("userId", "visitId")`,
    );
    // Codes and unblindings are records: never changed or removed (like visit reviews).
    for (const table of ['visit_blind_code', 'visit_unblinding']) {
      await queryRunner.query(`CREATE TRIGGER "${table}_no_update" BEFORE UPDATE ON "${table}"
        BEGIN SELECT RAISE(ABORT, '${table} rows are never changed'); END`);
      await queryRunner.query(`CREATE TRIGGER "${table}_no_delete" BEFORE DELETE ON "${table}"
        BEGIN SELECT RAISE(ABORT, '${table} rows are never removed'); END`);
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "visit_unblinding"`);
    await queryRunner.query(`DROP TABLE "visit_blind_code"`);
    await queryRunner.query(`ALTER TABLE "study" DROP COLUMN "blindedReview"`);
  }
}
