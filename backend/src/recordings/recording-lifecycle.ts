import { Injectable } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import type { RecordingState } from '@gyre/shared';
import { AuditActor, AuditService } from '../audit/audit.service';
import { nowIso } from '../common/time';
import { Recording } from './recording.entity';
import { RecordingsError, recordingsError } from './recordings.errors';

/**
 * Every move a recording's state may make, and nothing else. `queued` is re-entered from
 * `computing` when an attempt fails and will be retried, or when a job waits for its visit's
 * resting result; `superseded` ends a recording that a newer one of the same kind replaced.
 */
export const RECORDING_TRANSITIONS: Readonly<Record<RecordingState, readonly RecordingState[]>> = {
  received: ['validating', 'rejected'],
  validating: ['queued', 'rejected'],
  queued: ['computing', 'failed', 'superseded'],
  computing: ['ready', 'failed', 'queued', 'superseded'],
  ready: ['queued', 'superseded'],
  failed: ['queued', 'superseded'],
  rejected: [],
  superseded: [],
};

export function canTransition(from: RecordingState, to: RecordingState): boolean {
  return RECORDING_TRANSITIONS[from].includes(to);
}

/** The audit entry a transition writes with it. */
export interface TransitionEntry {
  actor: AuditActor | null;
  action: string;
  reason?: string | null;
  /** Extra facts for the entry's `after` (never an entity). */
  after?: Record<string, unknown>;
  clientIp?: string | null;
}

/**
 * The only writer of a recording's state: `transition` refuses what the table forbids, writes
 * the new state only if the row still has the state the caller saw (so two writers cannot both
 * win), and appends the audit entry in the same transaction.
 */
@Injectable()
export class RecordingLifecycle {
  constructor(private readonly audit: AuditService) {}

  async transition(
    tx: EntityManager,
    recording: Recording,
    to: RecordingState,
    entry: TransitionEntry,
    changes: Partial<Omit<Recording, 'id' | 'state'>> = {},
  ): Promise<Recording> {
    const from = recording.state;
    if (!canTransition(from, to)) {
      throw recordingsError(
        RecordingsError.IllegalTransition,
        `A ${from} recording cannot become ${to}.`,
        { recordingId: recording.id, from, to },
      );
    }
    const update = { ...changes, state: to, updatedAt: nowIso() };
    const result = await tx
      .getRepository(Recording)
      .update({ id: recording.id, state: from }, update);
    if (result.affected !== 1) {
      const now = await tx.getRepository(Recording).findOneBy({ id: recording.id });
      throw recordingsError(
        RecordingsError.IllegalTransition,
        `Recording ${recording.id} is no longer ${from} (now ${now?.state ?? 'missing'}).`,
        { recordingId: recording.id, from, to, now: now?.state ?? null },
      );
    }
    await this.record(recording, entry, { state: from }, to);
    return Object.assign(recording, update);
  }

  /** A new recording enters the table as `received`, with its own audit entry. */
  async create(tx: EntityManager, recording: Recording, entry: TransitionEntry): Promise<void> {
    if (recording.state !== 'received') {
      throw new Error(`A new recording starts as received, not ${recording.state}`);
    }
    await tx.getRepository(Recording).insert(recording);
    await this.record(recording, entry, null, 'received');
  }

  /** The audit entry of a recording's change: the state it left (null when new) and entered. */
  private async record(
    recording: Recording,
    entry: TransitionEntry,
    before: { state: RecordingState } | null,
    state: RecordingState,
  ): Promise<void> {
    await this.audit.record({
      actor: entry.actor,
      action: entry.action,
      objectType: 'Recording',
      objectId: recording.id,
      studyId: recording.studyId,
      siteId: recording.siteId,
      before,
      after: { state, ...(entry.after ?? {}) },
      reason: entry.reason ?? null,
      clientIp: entry.clientIp ?? null,
    });
  }
}
