/**
 * Generated test recordings and small API helpers for the recordings/jobs/analysis/flags
 * specs. Every recording here is synthetic: made by the signal core's generators
 * (src/signal/synthetic) and written with its EDF writer; the patient names are invented.
 */
import request from 'supertest';
import type { RecordingView, RecordingKind, RecordingState } from '@gyre/shared';
import {
  syntheticEdf,
  syntheticRestRecording,
  syntheticTaskRecording,
} from '../src/signal/synthetic/synthetic-eeg';
import type { TestApp } from './helpers/test-app';
import type { UserKey } from './helpers/seed';

/** An invented identity, written into the patient field of generated files. */
export const INVENTED_PATIENT_NAME = 'Ottilie_Quenneville-Brandstaetter';
export const INVENTED_PATIENT_FIELD = `MCH-0042 F 14-FEB-1947 ${INVENTED_PATIENT_NAME}`;

export const TASK_CHANNELS = ['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF', 'EEG Fz-REF'];

export interface TaskFileOptions {
  durationS?: number;
  sampleRateHz?: number;
  channels?: readonly string[];
  /** Default: every 4 s from 3 s to the end − 3 s. */
  onsetsS?: number[];
  dipHz?: number;
  seed?: number;
  patientId?: string;
  /** Write the onsets as EDF+ annotations (default true). */
  annotate?: boolean;
  /** Alpha frequency outside the dips, Hz (default 10). */
  baseFrequencyHz?: number;
  /**
   * 'hug': each signal's physical range written 0.01 % beyond its own largest sample, as many
   * exporting programs write it (default: a fixed ±500 µV).
   */
  physicalRange?: 'fixed' | 'hug';
}

export function taskOnsets(durationS: number, everyS = 4): number[] {
  const onsets: number[] = [];
  for (let t = 3; t <= durationS - 3; t += everyS) onsets.push(t);
  return onsets;
}

/** Generated EDF+C task recording: alpha at 10 Hz dipping by `dipHz` after each onset. */
export function syntheticTaskEdf(options: TaskFileOptions = {}): Uint8Array {
  const durationS = options.durationS ?? 60;
  const onsetsS = options.onsetsS ?? taskOnsets(durationS);
  const recording = syntheticTaskRecording({
    sampleRateHz: options.sampleRateHz ?? 256,
    durationS,
    channelLabels: options.channels ?? TASK_CHANNELS,
    onsetsS,
    dipHz: options.dipHz ?? -0.6,
    baseFrequencyHz: options.baseFrequencyHz,
    seed: options.seed ?? 7,
  });
  return syntheticEdf(recording, {
    startDate: '2026-01-15T09:30:00',
    patientId: options.patientId ?? INVENTED_PATIENT_FIELD,
    annotate: options.annotate !== false,
    signalHeader: (s) => (options.physicalRange === 'hug' ? huggingRange(s.samples) : {}),
  });
}

/** A physical range 0.01 % wider than the largest absolute sample, on both sides. */
function huggingRange(samples: Float32Array): { physicalMin: number; physicalMax: number } {
  let peak = 0;
  for (const v of samples) peak = Math.max(peak, Math.abs(v));
  return { physicalMin: -peak * 1.0001, physicalMax: peak * 1.0001 };
}

/** Generated EDF+C resting recording with an alpha peak at `peakHz`. */
export function syntheticRestEdf(
  options: { durationS?: number; peakHz?: number; seed?: number } = {},
): Uint8Array {
  const recording = syntheticRestRecording({
    sampleRateHz: 256,
    durationS: options.durationS ?? 60,
    channelLabels: TASK_CHANNELS,
    peakHz: options.peakHz ?? 9.5,
    seed: options.seed ?? 3,
  });
  return syntheticEdf(recording, {
    startDate: '2026-01-15T09:00:00',
    patientId: INVENTED_PATIENT_FIELD,
  });
}

export interface UploadInput {
  kind: RecordingKind | string;
  bytes: Uint8Array;
  onsetsCsv?: string;
  fileName?: string;
  confirmKind?: boolean;
  replaces?: { recordingId: string; reason: string };
}

export async function upload(
  t: TestApp,
  user: UserKey,
  visitId: string,
  input: UploadInput,
): Promise<request.Response> {
  let req = request(t.url)
    .post(`/api/visits/${visitId}/recordings`)
    .set(await t.authHeader(user))
    .field('kind', input.kind);
  if (input.confirmKind === true) req = req.field('confirmKind', 'true');
  if (input.replaces !== undefined) {
    req = req
      .field('replaces', input.replaces.recordingId)
      .field('replacementReason', input.replaces.reason);
  }
  req = req.attach('file', Buffer.from(input.bytes), {
    filename: input.fileName ?? 'recording.edf',
    contentType: 'application/octet-stream',
  });
  if (input.onsetsCsv !== undefined) {
    req = req.attach('onsets', Buffer.from(input.onsetsCsv, 'utf8'), {
      filename: 'onsets.csv',
      contentType: 'text/csv',
    });
  }
  return req;
}

/** Polls `GET /api/recordings/:id` until the state is one of `states`. */
export async function waitForState(
  t: TestApp,
  user: UserKey,
  recordingId: string,
  states: readonly RecordingState[],
  timeoutMs = 90_000,
): Promise<RecordingView> {
  const until = Date.now() + timeoutMs;
  let last: RecordingView | null = null;
  while (Date.now() < until) {
    const response = await request(t.url)
      .get(`/api/recordings/${recordingId}`)
      .set(await t.authHeader(user));
    if (response.status !== 200)
      throw new Error(`GET recording: ${response.status} ${JSON.stringify(response.body)}`);
    last = response.body as RecordingView;
    if (states.includes(last.state)) return last;
    await new Promise((resolve) => setTimeout(resolve, 150));
  }
  throw new Error(
    `Recording ${recordingId} still ${last?.state ?? 'unknown'} after ${timeoutMs} ms`,
  );
}
