import { AuditEntry } from '../audit/audit-entry.entity';
import { OneTimeToken } from '../auth/one-time-token.entity';
import { RefreshToken } from '../auth/refresh-token.entity';
import { OutboxMessage } from '../mail/outbox-message.entity';
import { Participant } from '../participants/participant.entity';
import { Site } from '../sites/site.entity';
import { Study } from '../studies/study.entity';
import { User } from '../accounts/user.entity';
import { Visit } from '../visits/visit.entity';
import { Recording } from '../recordings/recording.entity';
import { QueueJob } from '../queue/queue-job.entity';
import { AnalysisSettings } from '../analysis/analysis-settings.entity';
import { AnalysisRun } from '../analysis/analysis-run.entity';
import { VisitAnalysisOverride } from '../analysis/visit-analysis-override.entity';
import { Flag } from '../flags/flag.entity';
import { Report } from '../reports/report.entity';
import { ReportRevision } from '../signoff/report-revision.entity';
import { ReportNotification } from '../signoff/report-notification.entity';
import { SignInThrottle } from '../auth/sign-in-throttle.entity';
import { WorkerToken } from '../worker-tokens/worker-token.entity';
import { PlannedVisit } from '../schedule/planned-visit.entity';
import { StudyGroup } from '../schedule/study-group.entity';
import { VisitReview } from '../visit-reviews/visit-review.entity';
import { CalibrationRun } from '../calibration/calibration-run.entity';
import { BidsImportFile } from '../bids-import/bids-import-file.entity';
import { VisitBlindCode } from '../blinding/visit-blind-code.entity';
import { VisitUnblinding } from '../blinding/visit-unblinding.entity';

/** Every TypeORM entity, listed once; feature modules add theirs here (append only). */
// A constructor type rather than `Function`, which the lint rules refuse.
export const ENTITIES: (new () => object)[] = [
  Study,
  Site,
  User,
  Participant,
  Visit,
  RefreshToken,
  OneTimeToken,
  AuditEntry,
  OutboxMessage,
  Recording,
  QueueJob,
  AnalysisSettings,
  AnalysisRun,
  Flag,
  Report,
  ReportRevision,
  ReportNotification,
  VisitAnalysisOverride,
  SignInThrottle,
  WorkerToken,
  PlannedVisit,
  StudyGroup,
  VisitReview,
  BidsImportFile,
  CalibrationRun,
  VisitBlindCode,
  VisitUnblinding,
];
