import { DynamicModule, Module } from '@nestjs/common';
import { AccountsModule } from '../accounts/accounts.module';
import { AuditModule } from '../audit/audit.module';
import { PasswordHasherService } from '../auth/password-hasher.service';
import { CommonDatabaseModule } from '../common/database/common-database.module';
import { AppConfigModule } from '../config/config.module';
import { DatabaseModule } from '../database/database.module';
import { DemoSeedService } from './demo-seed.service';

/**
 * A standalone application context for the demo seeder (see `create-first-admin.ts`): the
 * configuration, the database (migrations applied) and the audit trail, nothing that serves HTTP.
 */
@Module({})
export class DemoModule {
  static forRoot(env: Record<string, unknown> = process.env): DynamicModule {
    return {
      module: DemoModule,
      imports: [
        AppConfigModule.forRoot(env),
        DatabaseModule,
        CommonDatabaseModule,
        AuditModule,
        AccountsModule,
      ],
      providers: [DemoSeedService, PasswordHasherService],
      exports: [DemoSeedService],
    };
  }
}
