import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The audit trail: append-only and hash-chained. The triggers make SQLite itself refuse any
 * UPDATE or DELETE, so no code path (nor a careless query) can rewrite history.
 */
export class AuditTrail1764633700100 implements MigrationInterface {
  name = 'AuditTrail1764633700100';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "audit_entry" (
      "seq" integer PRIMARY KEY NOT NULL,
      "at" varchar(30) NOT NULL,
      "actorId" varchar,
      "actorEmail" varchar(254),
      "action" varchar(60) NOT NULL,
      "objectType" varchar(40) NOT NULL,
      "objectId" varchar,
      "studyId" varchar,
      "siteId" varchar,
      "before" text,
      "after" text,
      "reason" text,
      "clientIp" varchar(64),
      "prevHash" varchar(64) NOT NULL,
      "hash" varchar(64) NOT NULL UNIQUE
    )`);
    await queryRunner.query(`CREATE INDEX "IDX_audit_study_at" ON "audit_entry" ("studyId", "at")`);
    await queryRunner.query(`CREATE INDEX "IDX_audit_actor" ON "audit_entry" ("actorId")`);
    await queryRunner.query(
      `CREATE INDEX "IDX_audit_object" ON "audit_entry" ("objectType", "objectId")`,
    );
    await queryRunner.query(`CREATE TRIGGER "audit_entry_no_update" BEFORE UPDATE ON "audit_entry"
      BEGIN SELECT RAISE(ABORT, 'audit entries are append-only: UPDATE refused'); END`);
    await queryRunner.query(`CREATE TRIGGER "audit_entry_no_delete" BEFORE DELETE ON "audit_entry"
      BEGIN SELECT RAISE(ABORT, 'audit entries are append-only: DELETE refused'); END`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER "audit_entry_no_delete"`);
    await queryRunner.query(`DROP TRIGGER "audit_entry_no_update"`);
    await queryRunner.query(`DROP TABLE "audit_entry"`);
  }
}
