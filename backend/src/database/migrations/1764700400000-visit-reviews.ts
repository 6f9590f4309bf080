import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * "Visit reviewed" acts: who looked at which of a visit's current runs (their fingerprint),
 * when. Rows are only added; the newest row of a visit is its review.
 */
export class VisitReviews1764700400000 implements MigrationInterface {
  name = 'VisitReviews1764700400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "visit_review" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL,
      "studyId" varchar(36) NOT NULL,
      "siteId" varchar(36) NOT NULL,
      "reviewedById" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "reviewedByName" varchar(200) NOT NULL,
      "reviewedAt" varchar(30) NOT NULL,
      "fingerprint" varchar(64) NOT NULL,
      "runIdsJson" text NOT NULL
    )`);
    await queryRunner.query(
      `CREATE INDEX "IDX_visit_review_visit" ON "visit_review" ("visitId", "reviewedAt")`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_visit_review_study" ON "visit_review" ("studyId", "visitId")`,
    );
    // The act is a record: like audit entries, a review is never changed or removed.
    await queryRunner.query(`CREATE TRIGGER "visit_review_no_update" BEFORE UPDATE ON "visit_review"
      BEGIN SELECT RAISE(ABORT, 'visit_review rows are never changed'); END`);
    await queryRunner.query(`CREATE TRIGGER "visit_review_no_delete" BEFORE DELETE ON "visit_review"
      BEGIN SELECT RAISE(ABORT, 'visit_review rows are never removed'); END`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "visit_review"`);
  }
}
