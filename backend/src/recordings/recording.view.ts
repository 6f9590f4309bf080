import type { JobDto, RecordingDto, RecordingFactsDto, RecordingRejection } from '@gyre/shared';
import { Job } from '../jobs/job.entity';
import type { RecordingFacts } from '../jobs/worker/worker-tasks';
import { Recording } from './recording.entity';

export function toJobDto(job: Job, settingsVersion: number): JobDto {
  return {
    id: job.id,
    recordingId: job.recordingId,
    state: job.state,
    attempts: job.attempts,
    maxAttempts: job.maxAttempts,
    progressPercent: job.progressPercent,
    settingsVersion,
    error: job.error,
    createdAt: job.createdAt,
    startedAt: job.startedAt,
    finishedAt: job.finishedAt,
  };
}

export function factsOf(row: Recording): RecordingFactsDto | null {
  if (row.factsJson === null) return null;
  const facts = JSON.parse(row.factsJson) as Omit<RecordingFacts, 'csvOnsets'>;
  const csv = row.csvOnsetsJson === null ? null : (JSON.parse(row.csvOnsetsJson) as unknown[]);
  return { ...facts, csvOnsetCount: csv === null ? null : csv.length };
}

export function toRecordingDto(
  row: Recording,
  latestJob: JobDto | null,
  latestRunId: string | null,
): RecordingDto {
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
    progressPercent: latestJob?.progressPercent ?? null,
    facts: factsOf(row),
    rejection:
      row.rejectionJson === null ? null : (JSON.parse(row.rejectionJson) as RecordingRejection),
    failureMessage: row.failureMessage,
    latestJob,
    latestRunId,
    uploadedById: row.uploadedById,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}
