import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { HealthReport } from '@gyre/shared';
import { GYRE_VERSION } from '../version';
import { errorMessage } from '../common/errors/error-message';

@Injectable()
export class HealthService {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  async report(): Promise<HealthReport> {
    const expected = this.dataSource.migrations.length;
    try {
      await this.dataSource.query('SELECT 1');
      const rows: unknown[] = await this.dataSource.query(
        `SELECT "name" FROM "migrations" ORDER BY "id"`,
      );
      const pending = await this.dataSource.showMigrations();
      return {
        status: pending ? 'degraded' : 'ok',
        version: GYRE_VERSION,
        database: { reachable: true },
        migrations: { applied: rows.length, expected, pending },
      };
    } catch (error) {
      return {
        status: 'down',
        version: GYRE_VERSION,
        database: {
          reachable: false,
          error: errorMessage(error),
        },
        migrations: { applied: 0, expected, pending: true },
      };
    }
  }
}
