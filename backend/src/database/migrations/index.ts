import { Initial1764633600000 } from './1764633600000-initial';
import { StudyModelAndAccounts1764633700000 } from './1764633700000-study-model-and-accounts';
import { AuditTrail1764633700100 } from './1764633700100-audit-trail';
import { MailOutbox1764633700200 } from './1764633700200-mail-outbox';
import { RecordingsAndAnalysis1764633800000 } from './1764633800000-recordings-and-analysis';
import { ReportSignoff1764633900000 } from './1764633900000-report-signoff';
import { RecordingPipeline1764700000000 } from './1764700000000-recording-pipeline';
import { SessionRevocation1764700100000 } from './1764700100000-session-revocation';
import { WorkerTokens1764700200000 } from './1764700200000-worker-tokens';
import { VisitScheduleAndGroups1764700300000 } from './1764700300000-visit-schedule-and-groups';
import { VisitReviews1764700400000 } from './1764700400000-visit-reviews';
import { RecordingFileName1764700600000 } from './1764700600000-recording-file-name';
import { CalibrationRuns1764700800000 } from './1764700800000-calibration-runs';
import { AnalysisDepthSettings1764701000000 } from './1764701000000-analysis-depth-settings';
import { RecordingLineFrequency1764700900000 } from './1764700900000-recording-line-frequency';
import { BidsImportFiles1764700700000 } from './1764700700000-bids-import-files';
import { BlindedReview1764701100000 } from './1764701100000-blinded-review';

/** Every migration in order; add new ones at the end (see DEVELOPERS.md). */
export const MIGRATIONS = [
  Initial1764633600000,
  StudyModelAndAccounts1764633700000,
  AuditTrail1764633700100,
  MailOutbox1764633700200,
  RecordingsAndAnalysis1764633800000,
  ReportSignoff1764633900000,
  RecordingPipeline1764700000000,
  SessionRevocation1764700100000,
  WorkerTokens1764700200000,
  VisitScheduleAndGroups1764700300000,
  VisitReviews1764700400000,
  RecordingFileName1764700600000,
  BidsImportFiles1764700700000,
  CalibrationRuns1764700800000,
  RecordingLineFrequency1764700900000,
  AnalysisDepthSettings1764701000000,
  BlindedReview1764701100000,
];
