import { DynamicModule, MiddlewareConsumer, Module, NestModule } from '@nestjs/common';
import { EventEmitterModule } from '@nestjs/event-emitter';
import { AppConfigModule } from './config/config.module';
import { DatabaseModule } from './database/database.module';
import { HealthModule } from './health/health.module';
import { RequestLoggerMiddleware } from './common/logging/request-logger.middleware';
import { CommonDatabaseModule } from './common/database/common-database.module';
import { AuditModule } from './audit/audit.module';
import { MailModule } from './mail/mail.module';
import { AuthModule } from './auth/auth.module';
import { UsersModule } from './users/users.module';
import { StudiesModule } from './studies/studies.module';
import { SitesModule } from './sites/sites.module';
import { ScheduleModule } from './schedule/schedule.module';
import { ParticipantsModule } from './participants/participants.module';
import { VisitsModule } from './visits/visits.module';
import { AnalysisModule } from './analysis/analysis.module';
import { ReportsModule } from './reports/reports.module';
import { JobsModule } from './jobs/jobs.module';
import { QueueModule } from './queue/queue.module';
import { ProcessingModule } from './processing/processing.module';
import { RecordingsModule } from './recordings/recordings.module';
import { BulkUploadsModule } from './bulk-uploads/bulk-uploads.module';
import { BidsImportModule } from './bids-import/bids-import.module';
import { FlagsModule } from './flags/flags.module';
import { TrajectoryModule } from './trajectory/trajectory.module';
import { SignoffModule } from './signoff/signoff.module';
import { WorkerTokensModule } from './worker-tokens/worker-tokens.module';
import { RemoteWorkersModule } from './remote-workers/remote-workers.module';
import { VisitReviewsModule } from './visit-reviews/visit-reviews.module';
import { WorklistModule } from './worklist/worklist.module';
import { StudyExportsModule } from './study-exports/study-exports.module';
import { StudyOverviewModule } from './study-overview/study-overview.module';
import { CalibrationModule } from './calibration/calibration.module';
import { BlindedDecisionsModule } from './blinding/blinded-decisions.module';

@Module({})
export class AppModule implements NestModule {
  /** Built at call time so that the environment is validated when the app is created. */
  static forRoot(env: Record<string, unknown> = process.env): DynamicModule {
    return {
      module: AppModule,
      imports: [
        AppConfigModule.forRoot(env),
        EventEmitterModule.forRoot(),
        DatabaseModule,
        CommonDatabaseModule,
        HealthModule,
        AuditModule,
        MailModule,
        AuthModule,
        UsersModule,
        StudiesModule,
        SitesModule,
        ScheduleModule,
        ParticipantsModule,
        VisitsModule,
        AnalysisModule,
        ReportsModule,
        QueueModule,
        JobsModule,
        RecordingsModule,
        BulkUploadsModule,
        BidsImportModule,
        ProcessingModule,
        FlagsModule,
        TrajectoryModule,
        SignoffModule,
        WorkerTokensModule,
        RemoteWorkersModule,
        VisitReviewsModule,
        WorklistModule,
        StudyExportsModule,
        StudyOverviewModule,
        CalibrationModule,
        BlindedDecisionsModule,
      ],
    };
  }

  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(RequestLoggerMiddleware).forRoutes('*path');
  }
}
