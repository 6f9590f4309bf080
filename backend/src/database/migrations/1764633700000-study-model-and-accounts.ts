import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Studies, sites, users, participants and visits, plus the sign-in tokens. Site-bound rows
 * carry `studyId` and `siteId` so that role scoping is a plain WHERE on the row itself.
 */
export class StudyModelAndAccounts1764633700000 implements MigrationInterface {
  name = 'StudyModelAndAccounts1764633700000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "study" (
      "id" varchar PRIMARY KEY NOT NULL,
      "code" varchar(32) NOT NULL UNIQUE,
      "name" varchar(200) NOT NULL,
      "description" text NOT NULL DEFAULT '',
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL
    )`);
    await queryRunner.query(`CREATE TABLE "site" (
      "id" varchar PRIMARY KEY NOT NULL,
      "studyId" varchar NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "code" varchar(32) NOT NULL,
      "name" varchar(200) NOT NULL,
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL,
      CONSTRAINT "UQ_site_study_code" UNIQUE ("studyId", "code")
    )`);
    await queryRunner.query(`CREATE TABLE "user" (
      "id" varchar PRIMARY KEY NOT NULL,
      "email" varchar(254) NOT NULL UNIQUE,
      "name" varchar(200) NOT NULL,
      "role" varchar(20) NOT NULL
        CHECK ("role" IN ('technician', 'analyst', 'monitor', 'coordinator', 'admin')),
      "studyId" varchar REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar REFERENCES "site" ("id") ON DELETE RESTRICT,
      "passwordHash" varchar(100),
      "state" varchar(20) NOT NULL CHECK ("state" IN ('invited', 'active', 'deactivated')),
      "failedSignIns" integer NOT NULL DEFAULT 0,
      "lockedUntil" varchar(30),
      "lastSignInAt" varchar(30),
      "passwordChangedAt" varchar(30),
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL,
      CHECK (("role" = 'admin') = ("studyId" IS NULL)),
      CHECK (("role" IN ('technician', 'coordinator')) = ("siteId" IS NOT NULL)),
      CHECK ("state" = 'invited' OR "passwordHash" IS NOT NULL)
    )`);
    await queryRunner.query(`CREATE INDEX "IDX_user_study_site" ON "user" ("studyId", "siteId")`);
    await queryRunner.query(`CREATE TABLE "participant" (
      "id" varchar PRIMARY KEY NOT NULL,
      "studyId" varchar NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "code" varchar(24) NOT NULL,
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL,
      CONSTRAINT "UQ_participant_study_code" UNIQUE ("studyId", "code")
    )`);
    await queryRunner.query(
      `CREATE INDEX "IDX_participant_study_site" ON "participant" ("studyId", "siteId")`,
    );
    await queryRunner.query(`CREATE TABLE "visit" (
      "id" varchar PRIMARY KEY NOT NULL,
      "participantId" varchar NOT NULL REFERENCES "participant" ("id") ON DELETE RESTRICT,
      "studyId" varchar NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "label" varchar(40) NOT NULL,
      "visitDate" varchar(10) NOT NULL,
      "createdAt" varchar(30) NOT NULL,
      "updatedAt" varchar(30) NOT NULL,
      CONSTRAINT "UQ_visit_participant_label" UNIQUE ("participantId", "label")
    )`);
    await queryRunner.query(`CREATE INDEX "IDX_visit_study_site" ON "visit" ("studyId", "siteId")`);
    await queryRunner.query(`CREATE TABLE "refresh_token" (
      "id" varchar PRIMARY KEY NOT NULL,
      "userId" varchar NOT NULL REFERENCES "user" ("id") ON DELETE CASCADE,
      "familyId" varchar NOT NULL,
      "tokenHash" varchar(64) NOT NULL UNIQUE,
      "createdAt" varchar(30) NOT NULL,
      "expiresAt" varchar(30) NOT NULL,
      "usedAt" varchar(30),
      "revokedAt" varchar(30),
      "revokedReason" varchar(40)
    )`);
    await queryRunner.query(
      `CREATE INDEX "IDX_refresh_token_family" ON "refresh_token" ("familyId")`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_refresh_token_user" ON "refresh_token" ("userId")`);
    await queryRunner.query(`CREATE TABLE "one_time_token" (
      "id" varchar PRIMARY KEY NOT NULL,
      "userId" varchar NOT NULL REFERENCES "user" ("id") ON DELETE CASCADE,
      "purpose" varchar(20) NOT NULL CHECK ("purpose" IN ('invitation', 'password_reset')),
      "tokenHash" varchar(64) NOT NULL UNIQUE,
      "createdAt" varchar(30) NOT NULL,
      "expiresAt" varchar(30) NOT NULL,
      "usedAt" varchar(30)
    )`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of [
      'one_time_token',
      'refresh_token',
      'visit',
      'participant',
      'user',
      'site',
      'study',
    ]) {
      await queryRunner.query(`DROP TABLE "${table}"`);
    }
  }
}
