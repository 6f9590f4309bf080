import type {
  JobView,
  RecordingView,
  RecordingFactsView,
  RecordingRejection,
  RoiUsageView,
} from '@gyre/shared';
import type { RecordingFacts } from '../jobs/worker/worker-tasks';
import type { QueuedJob } from '../queue/job-queue';
import { Recording } from './recording.entity';
import type { ComputationPayload } from './recordings.events';
import { kindWarning } from './kind-check';

export function toJobView(job: QueuedJob<ComputationPayload>): JobView {
  return {
    id: job.id,
    recordingId: job.payload.recordingId,
    state: job.state,
    attempts: job.attempts,
    maxAttempts: job.maxAttempts,
    progressPercent: job.progressPercent,
    trigger: job.payload.trigger,
    error: job.error,
    createdAt: job.createdAt,
    startedAt: job.startedAt,
    finishedAt: job.finishedAt,
  };
}

export function factsOf(row: Recording): RecordingFactsView | null {
  if (row.factsJson === null) return null;
  const facts = JSON.parse(row.factsJson) as Omit<RecordingFacts, 'csvOnsets'>;
  const csv = row.csvOnsetsJson === null ? null : (JSON.parse(row.csvOnsetsJson) as unknown[]);
  return { ...facts, csvOnsetCount: csv === null ? null : csv.length };
}

/** What a technician should know about the recording while the participant may still be there. */
function warningsOf(row: Recording, facts: RecordingFactsView | null): string[] {
  const warnings: string[] = [];
  if (row.kindConfirmed) warnings.push(kindWarning(row.kind, facts?.stimulusOnsetCount ?? 0));
  if (row.resultWarningsJson !== null) {
    warnings.push(...(JSON.parse(row.resultWarningsJson) as string[]));
  } else if (facts !== null) {
    warnings.push(...facts.warnings);
  }
  return warnings;
}

export function toRecordingView(row: Recording, latestJob: JobView | null): RecordingView {
  const facts = factsOf(row);
  return {
    id: row.id,
    studyId: row.studyId,
    siteId: row.siteId,
    participantId: row.participantId,
    visitId: row.visitId,
    kind: row.kind,
    state: row.state,
    checksumSha256: row.checksumSha256,
    sizeBytes: row.sizeBytes,
    fileName: row.fileName,
    lineFrequencyHz: row.lineFrequencyHz,
    progressPercent: latestJob?.progressPercent ?? null,
    facts,
    rejection:
      row.rejectionJson === null ? null : (JSON.parse(row.rejectionJson) as RecordingRejection),
    failureMessage: row.failureMessage,
    latestJob,
    latestRunId: row.latestRunId,
    kindConfirmed: row.kindConfirmed,
    warnings: warningsOf(row, facts),
    roiUsage: row.roiUsageJson === null ? null : (JSON.parse(row.roiUsageJson) as RoiUsageView),
    replacesId: row.replacesId,
    replacementReason: row.replacementReason,
    supersededById: row.supersededById,
    uploadedById: row.uploadedById,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}
