import { MigrationInterface, QueryRunner } from 'typeorm';

/** The first migration: a key-value table for facts about this installation. */
export class Initial1764633600000 implements MigrationInterface {
  name = 'Initial1764633600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "installation" ("key" varchar PRIMARY KEY NOT NULL, "value" text NOT NULL)`,
    );
    await queryRunner.query(
      `INSERT INTO "installation" ("key", "value") VALUES ('created_at', strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "installation"`);
  }
}
