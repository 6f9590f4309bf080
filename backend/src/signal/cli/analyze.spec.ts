import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeEdf } from '../edf/edf-writer';
import { syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import { main } from './analyze';

/** Runs the CLI in-process and captures what it writes. */
function run(argv: string[]): { code: number; stdout: string; stderr: string } {
  let stdout = '';
  let stderr = '';
  const out = jest.spyOn(process.stdout, 'write').mockImplementation((chunk) => {
    stdout += String(chunk);
    return true;
  });
  const err = jest.spyOn(process.stderr, 'write').mockImplementation((chunk) => {
    stderr += String(chunk);
    return true;
  });
  try {
    return { code: main(argv), stdout, stderr };
  } finally {
    out.mockRestore();
    err.mockRestore();
  }
}

describe('analyze CLI', () => {
  const dir = mkdtempSync(join(tmpdir(), 'gyre-cli-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  // Generated EDF+ task recording (Δf = −0.6 Hz by construction), written to the spec.
  const onsetsS = Array.from({ length: 20 }, (_, i) => 3 + 4 * i);
  const recording = syntheticTaskRecording({
    sampleRateHz: 250,
    durationS: 86,
    channelLabels: ['EEG O1-REF', 'EEG O2-REF', 'EEG Cz-REF'],
    onsetsS,
    seed: 5,
  });
  const annotations = [
    ...onsetsS.map((t, i) => ({ onsetS: t, durationS: null, text: i % 2 === 0 ? 'go' : 'nogo' })),
  ];
  const edfPath = join(dir, 'task.edf');
  writeFileSync(
    edfPath,
    writeEdf({
      startDate: '2024-03-01T10:00:00',
      signals: recording.signals.map((s) => ({
        label: s.label,
        sampleRateHz: s.sampleRateHz,
        physicalMin: -500,
        physicalMax: 500,
        samples: s.samples,
      })),
      annotations,
    }),
  );

  it('prints the task summary as JSON', () => {
    const { code, stdout } = run([edfPath]);
    expect(code).toBe(0);
    const report = JSON.parse(stdout) as {
      kind: string;
      channels: {
        label: string;
        deltaHz: number;
        ci95Hz: number[];
        p: number;
        trialsKept: number;
      }[];
      roi: { deltaHz: number; trialsKept: number; trialsDropped: number };
      rest: unknown;
      qc: { sampleRatesHz: number[] };
    };
    expect(report.kind).toBe('task');
    expect(report.channels.map((c) => c.label)).toEqual(['EEG O1-REF', 'EEG O2-REF', 'EEG Cz-REF']);
    expect(report.roi.trialsKept).toBe(20);
    expect(Math.abs(report.roi.deltaHz + 0.6)).toBeLessThan(0.05);
    expect(report.channels[0].ci95Hz).toHaveLength(2);
    expect(report.qc.sampleRatesHz).toEqual([250]);
  });

  it('chooses onsets by label and from a CSV', () => {
    const byLabel = JSON.parse(run([edfPath, '--onset-label', 'go']).stdout) as {
      roi: { trialsKept: number };
    };
    expect(byLabel.roi.trialsKept).toBe(10);
    const csvPath = join(dir, 'onsets.csv');
    writeFileSync(
      csvPath,
      'onset_s,label\n' +
        onsetsS
          .slice(0, 5)
          .map((t) => `${t},cue`)
          .join('\n'),
    );
    const fromCsv = JSON.parse(run([edfPath, '--onsets', csvPath, '--band', '8,13']).stdout) as {
      roi: { trialsKept: number };
      settings: { bandHz: number[] };
    };
    expect(fromCsv.roi.trialsKept).toBe(5);
    expect(fromCsv.settings.bandHz).toEqual([8, 13]);
  });

  it('exits non-zero with the reader message for a bad file', () => {
    const badPath = join(dir, 'bad.edf');
    writeFileSync(badPath, Buffer.from('not an EDF file at all'));
    const { code, stdout, stderr } = run([badPath]);
    expect(code).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toMatch(/^analyze: .+ found, .+ expected/);
  });

  it('exits non-zero for a task without onsets and for a bad option', () => {
    expect(run([edfPath, '--onset-label', 'absent', '--kind', 'task']).code).toBe(1);
    const bad = run([edfPath, '--band', '13']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--band: expected 2 number/);
  });
});
