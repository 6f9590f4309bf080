/**
 * What the server and a remote worker agree on: the BullMQ queue's name, the job id scheme and
 * the job's data. Plain TypeScript with no Nest, so the worker process (worker-cli.ts) and the
 * server's dispatcher (processing/remote-computations.service.ts) share one definition.
 */
import { Redis } from 'ioredis';
import type { AnalysisSettings } from '../signal/pipeline/analysis-settings';
import type { AnalyzeTask, RecordingKindName } from '../jobs/worker/worker-tasks';

/** The BullMQ queue computations travel on. */
export const ANALYSIS_QUEUE = 'gyre-analysis';

/** BullMQ's name for the one kind of job on that queue. */
export const ANALYZE_JOB_NAME = 'analyze';

/**
 * A computation as a worker receives it: `AnalyzeTask` without the file path and progress port
 * (the worker fetches the file itself), plus the ids that name the attempt.
 */
export interface RemoteTask {
  /** The SQLite job (Gyre's record of the computation). */
  jobId: string;
  /** Which of the job's attempts this is; results for any other attempt are refused (409). */
  attempt: number;
  recordingId: string;
  /** The stored file must hash to this (SHA-256 hex). */
  checksumSha256: string;
  /** Its size in bytes, so a worker can refuse a short download before hashing it. */
  fileBytes: number;
  kind: RecordingKindName;
  csvOnsets: Array<{ onsetS: number; label: string }> | null;
  /** The effective settings (the study's version with the visit's override). */
  settings: AnalysisSettings;
  /** The visit's resting IAF, Hz, when one exists. */
  iafHz: number | null;
  /** The server's Gyre version: a worker of another version does not compute (other numbers). */
  gyreVersion: string;
}

/** The local computation that answers `task` once its file is downloaded to `filePath`. */
export function analyzeTaskOf(task: RemoteTask, filePath: string): AnalyzeTask {
  return {
    filePath,
    checksumSha256: task.checksumSha256,
    kind: task.kind,
    csvOnsets: task.csvOnsets,
    settings: task.settings,
    iafHz: task.iafHz,
  };
}

/** The BullMQ job's data: the task, and what the server needs to store its result. */
export interface RemoteJobData extends RemoteTask {
  /** The settings version and visit override revision the task's settings came from. */
  settingsVersionId: string;
  overrideRevision: number | null;
}

/** Names one attempt of a job on both sides of the wire. */
export interface AttemptRef {
  jobId: string;
  attempt: number;
}

/**
 * BullMQ's job id for one attempt: the same attempt dispatched twice is one BullMQ job
 * (BullMQ ignores an add whose id exists), and a new attempt is a new one.
 */
export function remoteJobId(ref: AttemptRef): string {
  return `${ref.jobId}.${ref.attempt}`;
}

/** The attempt a BullMQ job id names, or null for an id Gyre did not make. */
export function parseRemoteJobId(id: string | undefined): AttemptRef | null {
  const match = /^([0-9a-f-]{36})\.([1-9][0-9]{0,5})$/.exec(id ?? '');
  return match === null ? null : { jobId: match[1], attempt: Number(match[2]) };
}

/**
 * A Redis client for BullMQ from a `redis://` or `rediss://` URL. Made here rather than by
 * BullMQ because ioredis is Gyre's own dependency (BullMQ only names it as an optional peer
 * and cannot load it from where npm puts it). Commands wait for Redis while it is away instead
 * of failing (BullMQ's advice for workers); BullMQ duplicates it for its blocking connections
 * and leaves it open: whoever opens it closes it (`quit`).
 */
export function openRedis(url: string): Redis {
  return new Redis(url, { maxRetriesPerRequest: null });
}
