import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A study's visit schedule and groups: `planned_visit` (name unique per study, target day from
 * enrolment and its window) and `study_group`; participants get an enrolment date and a group,
 * visits the planned visit they were registered on (one visit per participant and planned
 * visit); studies get the two trend settings. Existing rows keep their meaning: the new
 * columns are empty (null) or take their defaults, so existing visits read as "unplanned".
 */
export class VisitScheduleAndGroups1764700300000 implements MigrationInterface {
  name = 'VisitScheduleAndGroups1764700300000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "planned_visit" (
      "id" varchar PRIMARY KEY NOT NULL,
      "studyId" varchar NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "name" varchar(40) NOT NULL,
      "targetDay" integer NOT NULL CHECK ("targetDay" >= 0),
      "windowBeforeDays" integer NOT NULL CHECK ("windowBeforeDays" >= 0),
      "windowAfterDays" integer NOT NULL CHECK ("windowAfterDays" >= 0),
      "position" integer NOT NULL DEFAULT 0 CHECK ("position" >= 0),
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL
    )`);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "UQ_planned_visit_study_name" ON "planned_visit" ("studyId", "name" COLLATE NOCASE)`,
    );
    await queryRunner.query(`CREATE TABLE "study_group" (
      "id" varchar PRIMARY KEY NOT NULL,
      "studyId" varchar NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "name" varchar(60) NOT NULL,
      "description" varchar(2000) NOT NULL DEFAULT '',
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL
    )`);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "UQ_study_group_study_name" ON "study_group" ("studyId", "name" COLLATE NOCASE)`,
    );
    await queryRunner.query(
      `ALTER TABLE "participant" ADD COLUMN "enrolmentDate" varchar(10) DEFAULT NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "participant" ADD COLUMN "groupId" varchar DEFAULT NULL REFERENCES "study_group" ("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_participant_group" ON "participant" ("groupId") WHERE "groupId" IS NOT NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "visit" ADD COLUMN "plannedVisitId" varchar DEFAULT NULL REFERENCES "planned_visit" ("id") ON DELETE RESTRICT`,
    );
    await queryRunner.query(
      `CREATE UNIQUE INDEX "UQ_visit_participant_planned" ON "visit" ("participantId", "plannedVisitId") WHERE "plannedVisitId" IS NOT NULL`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_visit_planned" ON "visit" ("plannedVisitId") WHERE "plannedVisitId" IS NOT NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE "study" ADD COLUMN "trendMinVisits" integer NOT NULL DEFAULT 3 CHECK ("trendMinVisits" >= 2)`,
    );
    await queryRunner.query(
      `ALTER TABLE "study" ADD COLUMN "trendMinSpanDays" integer NOT NULL DEFAULT 90 CHECK ("trendMinSpanDays" >= 0)`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_visit_planned"`);
    await queryRunner.query(`DROP INDEX "UQ_visit_participant_planned"`);
    await queryRunner.query(`DROP INDEX "IDX_participant_group"`);
    for (const [table, column] of [
      ['study', 'trendMinSpanDays'],
      ['study', 'trendMinVisits'],
      ['visit', 'plannedVisitId'],
      ['participant', 'groupId'],
      ['participant', 'enrolmentDate'],
    ]) {
      await queryRunner.query(`ALTER TABLE "${table}" DROP COLUMN "${column}"`);
    }
    await queryRunner.query(`DROP TABLE "study_group"`);
    await queryRunner.query(`DROP TABLE "planned_visit"`);
  }
}
