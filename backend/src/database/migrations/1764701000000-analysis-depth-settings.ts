import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Three analysis settings join every stored settings value: the amplitude gate (off), the
 * cycle-by-cycle disagreement warning (0.1 Hz) and the two conditions to compare (the first
 * two). Stored versions and the settings each run used get them with the values that compute
 * exactly as before, appended in the settings' key order, so equal settings stay equal text.
 */
const TABLES: readonly (readonly [table: string, column: string])[] = [
  ['analysis_settings', 'valuesJson'],
  ['analysis_run', 'settingsJson'],
  ['calibration_run', 'settingsJson'],
];

export class AnalysisDepthSettings1764701000000 implements MigrationInterface {
  name = 'AnalysisDepthSettings1764701000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (const [table, column] of TABLES) {
      await queryRunner.query(
        `UPDATE "${table}" SET "${column}" = json_set("${column}",
           '$.amplitudeGatePercentile', json('null'),
           '$.cycleDisagreementHz', 0.1,
           '$.compareConditions', json('null'))
         WHERE json_type("${column}", '$.cycleDisagreementHz') IS NULL`,
      );
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [table, column] of TABLES) {
      await queryRunner.query(
        `UPDATE "${table}" SET "${column}" = json_remove("${column}",
           '$.amplitudeGatePercentile', '$.cycleDisagreementHz', '$.compareConditions')`,
      );
    }
  }
}
