import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Worker tokens: credentials for worker processes that may only read job inputs and write job
 * results. The secret's SHA-256 is stored, never the secret. One live token per name
 * (case-insensitive), so that the list and the Ledger name tokens without ambiguity; revoked
 * rows stay for the record.
 */
export class WorkerTokens1764700200000 implements MigrationInterface {
  name = 'WorkerTokens1764700200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "worker_token" (
      "id" varchar PRIMARY KEY NOT NULL,
      "name" varchar(100) NOT NULL,
      "secretHash" varchar(64) NOT NULL,
      "local" boolean NOT NULL DEFAULT (0),
      "createdAt" varchar(30) NOT NULL,
      "createdById" varchar REFERENCES "user" ("id") ON DELETE SET NULL,
      "lastUsedAt" varchar(30),
      "revokedAt" varchar(30),
      "revokedById" varchar REFERENCES "user" ("id") ON DELETE SET NULL,
      "revokedReason" varchar(2000)
    )`);
    await queryRunner.query(
      `CREATE UNIQUE INDEX "IDX_worker_token_live_name" ON "worker_token" ("name" COLLATE NOCASE)
        WHERE "revokedAt" IS NULL`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_worker_token_created" ON "worker_token" ("createdAt")`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "worker_token"`);
  }
}
