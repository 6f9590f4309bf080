import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountsModule } from '../accounts/accounts.module';
import { AnalysisModule } from '../analysis/analysis.module';
import { AuthModule } from '../auth/auth.module';
import { BlindingModule } from '../blinding/blinding.module';
import { FlagsModule } from '../flags/flags.module';
import { ParticipantsModule } from '../participants/participants.module';
import { RecordingsModule } from '../recordings/recordings.module';
import { ReportsModule } from '../reports/reports.module';
import { SitesModule } from '../sites/sites.module';
import { StudiesModule } from '../studies/studies.module';
import { UsersModule } from '../users/users.module';
import { VisitsModule } from '../visits/visits.module';
import { ReportFilesService } from './report-files.service';
import { ReportNotification } from './report-notification.entity';
import { ReportNotificationsService } from './report-notifications.service';
import { ReportRevision } from './report-revision.entity';
import { ReportRenderingService } from './report-rendering.service';
import { ReportRevisionsService } from './report-revisions.service';
import { RevisionViewsService } from './revision-views.service';
import { SignerVerificationService } from './signer-verification.service';
import { SignoffController } from './signoff.controller';
import { SignoffService } from './signoff.service';
import { VisitReportContentService } from './visit-report-content.service';

/** Report sign-off, signed revisions, their PDFs and the coordinator e-mail (issue 7). */
@Module({
  imports: [
    AccountsModule,
    AuthModule,
    AnalysisModule,
    BlindingModule,
    RecordingsModule,
    ReportsModule,
    FlagsModule,
    UsersModule,
    StudiesModule,
    SitesModule,
    ParticipantsModule,
    VisitsModule,
    TypeOrmModule.forFeature([ReportRevision, ReportNotification]),
  ],
  controllers: [SignoffController],
  providers: [
    SignoffService,
    ReportRevisionsService,
    ReportNotificationsService,
    ReportFilesService,
    ReportRenderingService,
    SignerVerificationService,
    VisitReportContentService,
    RevisionViewsService,
  ],
  exports: [SignoffService],
})
export class SignoffModule {}
