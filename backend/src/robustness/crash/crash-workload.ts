/**
 * What the crash test's clients do while the server is being killed: two technicians' worth of
 * uploads (valid resting and task recordings, a bad file now and then, replacements) and an
 * analyst's re-runs, from a seeded schedule. Each action remembers what the server answered,
 * so the end of the test can hold every accepted upload to its promise. A request cut off by
 * a kill has no answer: its visit slot is never used again, and its fate is read from the
 * database at the end.
 */
import type { RecordingView } from '@gyre/shared';
import { caseSeed, Rng } from '../seeded-random';
import { GyreClient } from './gyre-client';
import {
  badUpload,
  GeneratedUpload,
  restingUpload,
  taskUpload,
  UploadSizes,
} from './recording-files';

export type ActionKind = 'resting' | 'task' | 'bad' | 'rerun' | 'replace';

const ACTION_WEIGHTS: ReadonlyArray<readonly [ActionKind, number]> = [
  ['resting', 3],
  ['task', 3],
  ['bad', 1],
  ['rerun', 1.5],
  ['replace', 1],
];

interface Slot {
  visitId: string;
  kind: 'resting' | 'task';
  /** free: no current recording; taken: `recordingId` is current; dirty: unknown (cut off). */
  state: 'free' | 'taken' | 'dirty';
  recordingId: string | null;
}

export interface TrackedUpload {
  action: number;
  visitId: string;
  kind: 'resting' | 'task';
  expect: GeneratedUpload['expect'];
  description: string;
  /** HTTP status, 0 when the request was cut off by a kill. */
  status: number;
  recordingId: string | null;
  /** The recording this upload replaces, when it is a replacement. */
  replacesId: string | null;
}

export interface WorkloadFigures {
  uploads: TrackedUpload[];
  reruns: { requested: number; byStatus: Record<string, number> };
}

export class CrashWorkload {
  private readonly slots: Slot[] = [];
  private next = 0;
  private stopped = false;
  private gate: Promise<void> = Promise.resolve();
  private openGate: () => void = () => undefined;
  private uploadListeners: Array<() => void> = [];
  readonly figures: WorkloadFigures = { uploads: [], reruns: { requested: 0, byStatus: {} } };
  uploadsInFlight = 0;

  constructor(
    private readonly client: GyreClient,
    visitIds: readonly string[],
    private readonly seed: number,
    private readonly sizes: UploadSizes,
  ) {
    for (const visitId of visitIds) {
      this.slots.push({ visitId, kind: 'resting', state: 'free', recordingId: null });
      this.slots.push({ visitId, kind: 'task', state: 'free', recordingId: null });
    }
  }

  /** The server is down: actions wait until `resume`. */
  pause(): void {
    this.gate = new Promise((open) => (this.openGate = open));
  }

  resume(): void {
    this.openGate();
  }

  stop(): void {
    this.stopped = true;
    this.openGate();
  }

  /** Resolves when the next upload request starts (for kills aimed at an upload). */
  nextUploadStart(): Promise<void> {
    return new Promise((resolve) => this.uploadListeners.push(resolve));
  }

  /** One client: takes the next action of the schedule until stopped. */
  async actor(): Promise<void> {
    while (!this.stopped) {
      await this.gate;
      if (this.stopped) break;
      const index = this.next++;
      // Each action has its own generator: the schedule does not depend on which actor ran what.
      const rng = new Rng(caseSeed(this.seed, index));
      await this.perform(index, rng);
      await new Promise((resolve) => setTimeout(resolve, rng.int(20, 250)));
    }
  }

  private pickSlot(rng: Rng, filter: (s: Slot) => boolean): Slot | null {
    const candidates = this.slots.filter(filter);
    return candidates.length === 0 ? null : rng.pick(candidates);
  }

  private async perform(index: number, rng: Rng): Promise<void> {
    const action = rng.weighted(ACTION_WEIGHTS);
    const fileSeed = 1000 + index;
    if (action === 'rerun') {
      const slot = this.pickSlot(rng, (s) => s.state === 'taken');
      if (slot === null) return;
      this.figures.reruns.requested += 1;
      const response = await this.client.call(
        'POST',
        `/api/recordings/${slot.recordingId}/runs`,
        'analyst',
        {
          json: { reason: 'crash test re-run' },
        },
      );
      const key = String(response.status);
      this.figures.reruns.byStatus[key] = (this.figures.reruns.byStatus[key] ?? 0) + 1;
      return;
    }
    if (action === 'replace') {
      const slot = this.pickSlot(rng, (s) => s.state === 'taken' && s.kind === 'resting');
      if (slot === null) return;
      await this.upload(index, slot, restingUpload(rng, this.sizes, fileSeed), slot.recordingId);
      return;
    }
    const kind = action === 'task' ? 'task' : 'resting';
    // Task uploads go to visits that already have a resting recording when possible, so the
    // task's band follows the resting IAF (a task job waits for its visit's resting result).
    const slot =
      (kind === 'task' && rng.bool(0.7)
        ? this.pickSlot(
            rng,
            (s) =>
              s.kind === 'task' &&
              s.state === 'free' &&
              this.slots.some(
                (r) => r.visitId === s.visitId && r.kind === 'resting' && r.state === 'taken',
              ),
          )
        : null) ?? this.pickSlot(rng, (s) => s.kind === kind && s.state === 'free');
    if (slot === null) return;
    const file =
      action === 'bad'
        ? badUpload(rng, this.sizes, fileSeed)
        : kind === 'task'
          ? taskUpload(rng, this.sizes, fileSeed)
          : restingUpload(rng, this.sizes, fileSeed);
    await this.upload(index, slot, file, null);
  }

  private async upload(
    index: number,
    slot: Slot,
    file: GeneratedUpload,
    replacesId: string | null,
  ): Promise<void> {
    // Claimed before the request, so the other client never uploads to the same slot at once.
    const previous = slot.state;
    slot.state = 'dirty';
    this.uploadsInFlight += 1;
    for (const listener of this.uploadListeners.splice(0)) listener();
    const response = await this.client.upload(slot.visitId, {
      kind: file.kind,
      bytes: file.bytes,
      onsetsCsv: file.onsetsCsv,
      replaces:
        replacesId === null
          ? undefined
          : { recordingId: replacesId, reason: 'crash test: replaced by a new recording' },
    });
    this.uploadsInFlight -= 1;
    const body = response.body as
      (RecordingView & { details?: { recording?: RecordingView } }) | null;
    const recordingId =
      response.status === 201 ? (body?.id ?? null) : (body?.details?.recording?.id ?? null);
    this.figures.uploads.push({
      action: index,
      visitId: slot.visitId,
      kind: file.kind,
      expect: file.expect,
      description: file.description,
      status: response.status,
      recordingId,
      replacesId,
    });
    if (response.status === 201) {
      slot.state = 'taken';
      slot.recordingId = recordingId;
    } else if (response.status === 0) {
      slot.state = 'dirty'; // accepted or not: only the database knows
    } else {
      // Refused (422 bad file, 409): the slot is as it was.
      slot.state = previous;
    }
  }
}
