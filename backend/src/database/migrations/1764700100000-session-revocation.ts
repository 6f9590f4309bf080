import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Sessions that end when they should:
 * - `refresh_token."successorSealed"`: the successor's secret, sealed with a key derived from
 *   this token's own secret (never stored), so that a second use within the grace period
 *   (two tabs refreshing at once) can be given the same successor;
 * - `sign_in_throttle`: failed sign-ins per account, per address and per pair of them, with
 *   the time the next attempt is allowed (growing delays instead of a lock a stranger can set);
 * - a trigger that revokes every refresh token of a user whose account gets locked (by
 *   signing with wrong passwords), whichever module writes the lock; access tokens name their
 *   refresh family and die with it.
 */
export class SessionRevocation1764700100000 implements MigrationInterface {
  name = 'SessionRevocation1764700100000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE "refresh_token" ADD COLUMN "successorSealed" varchar(200)`,
    );
    await queryRunner.query(`CREATE TABLE "sign_in_throttle" (
      "key" varchar(64) PRIMARY KEY NOT NULL,
      "scope" varchar(10) NOT NULL CHECK ("scope" IN ('account', 'address', 'pair')),
      "failures" integer NOT NULL CHECK ("failures" >= 0),
      "lastFailureAt" varchar(30) NOT NULL,
      "blockedUntil" varchar(30) NOT NULL
    )`);
    await queryRunner.query(
      `CREATE INDEX "IDX_sign_in_throttle_last_failure" ON "sign_in_throttle" ("lastFailureAt")`,
    );
    await queryRunner.query(`CREATE TRIGGER "user_lock_ends_sessions"
      AFTER UPDATE OF "lockedUntil" ON "user"
      WHEN NEW."lockedUntil" IS NOT NULL
        AND NEW."lockedUntil" IS NOT OLD."lockedUntil"
        AND NEW."lockedUntil" > strftime('%Y-%m-%dT%H:%M:%fZ', 'now')
      BEGIN
        UPDATE "refresh_token"
          SET "revokedAt" = strftime('%Y-%m-%dT%H:%M:%fZ', 'now'), "revokedReason" = 'locked'
          WHERE "userId" = NEW."id" AND "revokedAt" IS NULL;
      END`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER "user_lock_ends_sessions"`);
    await queryRunner.query(`DROP TABLE "sign_in_throttle"`);
    await queryRunner.query(`ALTER TABLE "refresh_token" DROP COLUMN "successorSealed"`);
  }
}
