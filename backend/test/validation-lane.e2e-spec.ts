/**
 * Validation has a lane of its own: an upload is checked and answered while every analysis
 * thread is busy with long computations. Recordings are generated (recordings-fixtures.ts).
 */
import type { RecordingView } from '@gyre/shared';
import { useTestApp } from './helpers/test-app';
import { writeEdf } from '../src/signal/edf';
import { syntheticTaskRecording } from '../src/signal/synthetic/synthetic-eeg';
import { syntheticTaskEdf, taskOnsets, upload, waitForState } from './recordings-fixtures';

/** 32 scalp electrodes of the 10-10 system (ACNS Guideline 2, 2016). */
const LABELS = [
  'Fp1',
  'Fp2',
  'AF3',
  'AF4',
  'F7',
  'F3',
  'Fz',
  'F4',
  'F8',
  'FC5',
  'FC1',
  'FC2',
  'FC6',
  'T7',
  'C3',
  'Cz',
  'C4',
  'T8',
  'CP5',
  'CP1',
  'CP2',
  'CP6',
  'P7',
  'P3',
  'Pz',
  'P4',
  'P8',
  'PO3',
  'PO4',
  'O1',
  'Oz',
  'O2',
];

describe('validation lane', () => {
  const t = useTestApp();

  it('answers an upload while two long analyses hold both analysis threads', async () => {
    // One generated channel under 32 labels: generating 32 would take longer than the test.
    const long = (seed: number): Uint8Array => {
      const onsetsS = taskOnsets(600);
      const one = syntheticTaskRecording({
        sampleRateHz: 500,
        durationS: 600,
        channelLabels: ['O1'],
        onsetsS,
        seed,
      });
      const samples = one.signals[0].samples;
      return writeEdf({
        startDate: '2026-01-15T09:30:00',
        patientId: 'X X X X',
        signals: LABELS.map((label) => ({
          label,
          sampleRateHz: 500,
          physicalMin: -500,
          physicalMax: 500,
          samples,
        })),
        annotations: (one.annotations ?? []).map((a) => ({ ...a })),
      });
    };
    const first = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'task',
      bytes: long(51),
    });
    const second = await upload(t, 'technicianA2', t.seed.visits.A2.id, {
      kind: 'task',
      bytes: long(52),
    });
    expect([first.status, second.status]).toEqual([201, 201]);
    const a = first.body as RecordingView;
    const b = second.body as RecordingView;
    await waitForState(t, 'technician', a.id, ['computing']);
    await waitForState(t, 'technicianA2', b.id, ['computing']);

    const started = Date.now();
    const small = await upload(t, 'technicianB', t.seed.visits.B1.id, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 30, seed: 53 }),
    });
    const answeredAfterMs = Date.now() - started;
    expect(small.status).toBe(201);
    // Both analyses are still running when the validated upload has been answered.
    const [stillA, stillB] = await Promise.all([
      waitForState(t, 'technician', a.id, ['computing', 'ready']),
      waitForState(t, 'technicianA2', b.id, ['computing', 'ready']),
    ]);
    expect([stillA.state, stillB.state]).toEqual(['computing', 'computing']);
    expect(answeredAfterMs).toBeLessThan(10_000);
    await t.computationsIdle();
  }, 240_000);
});
