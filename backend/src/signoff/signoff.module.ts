import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuthModule } from '../auth/auth.module';
import { User } from '../users/user.entity';
import { ReportFiles } from './report-files';
import { ReportNotification } from './report-notification.entity';
import { ReportNotifications } from './report-notifications';
import { ReportRevision } from './report-revision.entity';
import { ReportRendering } from './report-rendering';
import { ReportRevisionsService } from './report-revisions.service';
import { SignerVerification } from './signer-verification';
import { SignoffController } from './signoff.controller';
import { SignoffService } from './signoff.service';
import { VisitReportContent } from './visit-report-content';

/** Report sign-off, signed revisions, their PDFs and the coordinator e-mail (issue 7). */
@Module({
  imports: [AuthModule, TypeOrmModule.forFeature([ReportRevision, ReportNotification, User])],
  controllers: [SignoffController],
  providers: [
    SignoffService,
    ReportRevisionsService,
    ReportNotifications,
    ReportFiles,
    ReportRendering,
    SignerVerification,
    VisitReportContent,
  ],
  exports: [SignoffService],
})
export class SignoffModule {}
