import { writeEdf } from '../../signal/edf';
import type { EdfWriteSpec } from '../../signal/edf';
import { scratchFolder } from '../../signal/testing/scratch-folder';
import { validateRecording } from './validate-recording';

// Generated EDF+ files (Kemp et al. 1992; Kemp & Olivan 2003): 20 s of a 10 Hz tone on O1, O2.
const SAMPLE_RATE_HZ = 200;
const tone = Float32Array.from(
  { length: 20 * SAMPLE_RATE_HZ },
  (_, i) => 20 * Math.sin((2 * Math.PI * 10 * i) / SAMPLE_RATE_HZ),
);
const spec = (annotations: EdfWriteSpec['annotations']): EdfWriteSpec => ({
  format: 'EDF+C',
  startDate: '2024-05-06T09:00:00',
  signals: ['O1', 'O2'].map((label) => ({
    label,
    sampleRateHz: SAMPLE_RATE_HZ,
    physicalMin: -500,
    physicalMax: 500,
    samples: tone,
  })),
  annotations,
});

describe('validateRecording', () => {
  const { write, remove } = scratchFolder('gyre-validate-');
  afterAll(remove);
  const plain = write('plain.edf', writeEdf(spec([])));
  const annotated = write(
    'annotated.edf',
    writeEdf(
      spec([
        { onsetS: 3, durationS: null, text: 'go' },
        { onsetS: 7, durationS: null, text: 'nogo' },
        { onsetS: 9, durationS: 1, text: 'Artifact: blink' },
        { onsetS: 11, durationS: null, text: 'go' },
      ]),
    ),
  );

  it('accepts a task recording without onsets and says it has none', async () => {
    const outcome = await validateRecording({ filePath: plain, kind: 'task', onsetsCsv: null });
    expect(outcome.ok).toBe(true);
    if (outcome.ok) {
      expect(outcome.facts.stimulusOnsetCount).toBe(0);
      expect(outcome.facts.annotationCount).toBe(0);
    }
  });

  it('counts stimulus annotations without the artefact marks', async () => {
    const outcome = await validateRecording({
      filePath: annotated,
      kind: 'resting',
      onsetsCsv: null,
    });
    expect(outcome.ok).toBe(true);
    if (outcome.ok) {
      expect(outcome.facts.annotationCount).toBe(4);
      expect(outcome.facts.stimulusOnsetCount).toBe(3);
      expect(outcome.facts.csvOnsets).toBeNull();
    }
  });

  it('counts the CSV rows when a CSV came', async () => {
    const outcome = await validateRecording({
      filePath: annotated,
      kind: 'task',
      onsetsCsv: 'onset_s,label\n2,cue\n6,cue\n',
    });
    expect(outcome.ok).toBe(true);
    if (outcome.ok) {
      expect(outcome.facts.stimulusOnsetCount).toBe(2);
      expect(outcome.facts.csvOnsets).toEqual([
        { onsetS: 2, label: 'cue' },
        { onsetS: 6, label: 'cue' },
      ]);
    }
  });

  it('keeps the real validation errors', async () => {
    // EDF spec: header bytes + records × record size = file size; 1000 bytes short is not.
    const whole = writeEdf(spec([]));
    const cut = write('cut.edf', whole.subarray(0, whole.length - 1000));
    const truncated = await validateRecording({ filePath: cut, kind: 'task', onsetsCsv: null });
    expect(truncated.ok).toBe(false);
    const late = await validateRecording({
      filePath: plain,
      kind: 'task',
      onsetsCsv: 'onset_s,label\n25,cue\n',
    });
    expect(late).toMatchObject({ ok: false, field: 'onsets' });
    const empty = await validateRecording({
      filePath: plain,
      kind: 'task',
      onsetsCsv: 'onset_s,label\n',
    });
    expect(empty).toMatchObject({ ok: false, field: 'onsets', found: 'no onset rows' });
    const restingCsv = await validateRecording({
      filePath: plain,
      kind: 'resting',
      onsetsCsv: 'onset_s,label\n2,cue\n',
    });
    expect(restingCsv).toMatchObject({ ok: false, field: 'onsets' });
  });
});
