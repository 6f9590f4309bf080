import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Signed report revisions and the coordinator e-mails about them. A signed revision is
 * immutable in the database itself: triggers refuse DELETE and any UPDATE other than the one
 * step signed → sent (21 CFR Part 11 §11.10(e), §11.70: the record and its signature stay
 * linked and unaltered).
 */
export class ReportSignoff1764633900000 implements MigrationInterface {
  name = 'ReportSignoff1764633900000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "report_revision" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "reportId" varchar(36) NOT NULL REFERENCES "report" ("id") ON DELETE RESTRICT,
      "visitId" varchar(36) NOT NULL REFERENCES "visit" ("id") ON DELETE RESTRICT,
      "participantId" varchar(36) NOT NULL REFERENCES "participant" ("id") ON DELETE RESTRICT,
      "studyId" varchar(36) NOT NULL REFERENCES "study" ("id") ON DELETE RESTRICT,
      "siteId" varchar(36) NOT NULL REFERENCES "site" ("id") ON DELETE RESTRICT,
      "revision" integer NOT NULL CHECK ("revision" >= 1),
      "state" varchar(16) NOT NULL CHECK ("state" IN ('signed', 'sent')),
      "signedById" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "signerName" varchar(200) NOT NULL,
      "signerEmail" varchar(254) NOT NULL,
      "signedAt" varchar(30) NOT NULL,
      "meaning" varchar(200) NOT NULL,
      "contentFingerprint" varchar(64) NOT NULL,
      "pdfSha256" varchar(64) NOT NULL CHECK (length("pdfSha256") = 64),
      "pdfSizeBytes" integer NOT NULL CHECK ("pdfSizeBytes" > 0),
      "supersedesId" varchar(36) REFERENCES "report_revision" ("id") ON DELETE RESTRICT,
      "sentAt" varchar(30),
      CHECK (("state" = 'sent') = ("sentAt" IS NOT NULL))
    )`);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "IDX_report_revision_number" ON "report_revision" ("reportId", "revision")`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_report_revision_site" ON "report_revision" ("siteId", "signedAt")`,
    );
    await queryRunner.query(`CREATE TRIGGER "report_revision_no_delete"
      BEFORE DELETE ON "report_revision"
      BEGIN SELECT RAISE(ABORT, 'signed report revisions are permanent: DELETE refused'); END`);
    // Only signed → sent may change, and only state and sentAt with it.
    await queryRunner.query(`CREATE TRIGGER "report_revision_signed_is_final"
      BEFORE UPDATE ON "report_revision"
      WHEN NEW."id" IS NOT OLD."id"
        OR NEW."reportId" IS NOT OLD."reportId"
        OR NEW."visitId" IS NOT OLD."visitId"
        OR NEW."participantId" IS NOT OLD."participantId"
        OR NEW."studyId" IS NOT OLD."studyId"
        OR NEW."siteId" IS NOT OLD."siteId"
        OR NEW."revision" IS NOT OLD."revision"
        OR NEW."signedById" IS NOT OLD."signedById"
        OR NEW."signerName" IS NOT OLD."signerName"
        OR NEW."signerEmail" IS NOT OLD."signerEmail"
        OR NEW."signedAt" IS NOT OLD."signedAt"
        OR NEW."meaning" IS NOT OLD."meaning"
        OR NEW."contentFingerprint" IS NOT OLD."contentFingerprint"
        OR NEW."pdfSha256" IS NOT OLD."pdfSha256"
        OR NEW."pdfSizeBytes" IS NOT OLD."pdfSizeBytes"
        OR NEW."supersedesId" IS NOT OLD."supersedesId"
        OR (NEW."state" IS NOT OLD."state" AND NOT (OLD."state" = 'signed' AND NEW."state" = 'sent'))
        OR (OLD."sentAt" IS NOT NULL AND NEW."sentAt" IS NOT OLD."sentAt")
      BEGIN SELECT RAISE(ABORT, 'a signed report revision never changes: UPDATE refused'); END`);

    await queryRunner.query(`CREATE TABLE "report_notification" (
      "id" varchar(36) PRIMARY KEY NOT NULL,
      "revisionId" varchar(36) NOT NULL REFERENCES "report_revision" ("id") ON DELETE RESTRICT,
      "outboxMessageId" varchar(36) NOT NULL REFERENCES "outbox_message" ("id") ON DELETE RESTRICT,
      "recipientUserId" varchar(36) NOT NULL REFERENCES "user" ("id") ON DELETE RESTRICT,
      "toAddress" varchar(254) NOT NULL,
      "createdAt" varchar(30) NOT NULL
    )`);
    await queryRunner.query(
      `CREATE INDEX "IDX_report_notification_revision" ON "report_notification" ("revisionId")`,
    );
    await queryRunner.query(
      `CREATE UNIQUE INDEX "IDX_report_notification_message" ON "report_notification" ("outboxMessageId")`,
    );
    await queryRunner.query(`CREATE TRIGGER "report_notification_no_change"
      BEFORE UPDATE ON "report_notification"
      BEGIN SELECT RAISE(ABORT, 'report notifications are a record: UPDATE refused'); END`);
    await queryRunner.query(`CREATE TRIGGER "report_notification_no_delete"
      BEFORE DELETE ON "report_notification"
      BEGIN SELECT RAISE(ABORT, 'report notifications are a record: DELETE refused'); END`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER "report_notification_no_delete"`);
    await queryRunner.query(`DROP TRIGGER "report_notification_no_change"`);
    await queryRunner.query(`DROP TABLE "report_notification"`);
    await queryRunner.query(`DROP TRIGGER "report_revision_signed_is_final"`);
    await queryRunner.query(`DROP TRIGGER "report_revision_no_delete"`);
    await queryRunner.query(`DROP TABLE "report_revision"`);
  }
}
