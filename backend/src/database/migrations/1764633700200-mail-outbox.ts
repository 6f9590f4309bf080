import { MigrationInterface, QueryRunner } from 'typeorm';

/** Outgoing e-mail, kept until sent and retried with backoff. */
export class MailOutbox1764633700200 implements MigrationInterface {
  name = 'MailOutbox1764633700200';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "outbox_message" (
      "id" varchar PRIMARY KEY NOT NULL,
      "kind" varchar(40) NOT NULL,
      "toAddress" varchar(254) NOT NULL,
      "subject" varchar(300) NOT NULL,
      "textBody" text,
      "state" varchar(10) NOT NULL CHECK ("state" IN ('queued', 'sent', 'failed')),
      "attempts" integer NOT NULL DEFAULT 0,
      "nextAttemptAt" varchar(30),
      "lastError" text,
      "messageId" varchar(300),
      "createdAt" varchar(30) NOT NULL,
      "sentAt" varchar(30)
    )`);
    await queryRunner.query(
      `CREATE INDEX "IDX_outbox_due" ON "outbox_message" ("state", "nextAttemptAt")`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "outbox_message"`);
  }
}
