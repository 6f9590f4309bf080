import { parseOnsetCsv } from '../signal/onsets/onset-csv';
import {
  badChannels,
  eventsToOnsets,
  kindOfTask,
  readEegSidecar,
  scanDates,
  SidecarError,
} from './bids-sidecars';

const tsv = (...lines: string[]): Buffer => Buffer.from(`${lines.join('\n')}\n`);

describe('EEG-BIDS sidecars (bids-specification.readthedocs.io, EEG section)', () => {
  it('events.tsv: onset → seconds, trial_type → label, n/a → the task label; the CSV reads back', () => {
    const events = eventsToOnsets(
      tsv(
        'onset\tduration\ttrial_type\tvalue',
        '1.5\t0.5\ttarget\t1',
        '4.25\tn/a\tn/a\t2',
        '7\t0\tgo, fast\t3',
      ),
      'x_events.tsv',
      'oddball',
    );
    expect(events.count).toBe(3);
    expect(events.conditions).toEqual(['target', 'oddball', 'go, fast']);
    // The product's own onset CSV reader takes what the import hands the validation lane.
    const onsets = parseOnsetCsv(events.onsetsCsv, { recordingDurationS: 10 });
    expect(onsets.map((o) => [o.onsetS, o.label, o.durationS])).toEqual([
      [1.5, 'target', 0.5],
      [4.25, 'oddball', null],
      [7, 'go, fast', 0],
    ]);
  });

  it('events.tsv: onset and duration are REQUIRED columns; a non-number onset is named', () => {
    expect(() => eventsToOnsets(tsv('start\tduration', '1\t0'), 'e.tsv', 't')).toThrow(
      "e.tsv: no 'onset' column found (columns: start, duration)",
    );
    expect(() => eventsToOnsets(tsv('onset\ttrial_type', '1\ta'), 'e.tsv', 't')).toThrow(
      /no 'duration' column/,
    );
    expect(() => eventsToOnsets(tsv('onset\tduration', 'n/a\t0'), 'e.tsv', 't')).toThrow(
      "e.tsv: line 2, column onset: 'n/a' found, a number of seconds expected",
    );
  });

  it('channels.tsv: status bad → left out with status_description as the reason', () => {
    const bad = badChannels(
      tsv(
        'name\ttype\tunits\tstatus\tstatus_description',
        'O1\tEEG\tuV\tgood\tn/a',
        'O2\tEEG\tuV\tbad\telectrode bridged',
        'Pz\tEEG\tuV\tbad\tn/a',
      ),
      'c.tsv',
    );
    expect(bad).toEqual([
      { label: 'O2', reason: 'electrode bridged' },
      { label: 'Pz', reason: null },
    ]);
    expect(() => badChannels(tsv('name\tstatus', 'O1\tmaybe'), 'c.tsv')).toThrow(
      "c.tsv: line 2, column status: 'maybe' found, good, bad or n/a expected",
    );
    expect(badChannels(tsv('name\ttype\tunits', 'O1\tEEG\tuV'), 'c.tsv')).toEqual([]);
  });

  it('eeg.json: PowerLineFrequency 50, 60 or n/a; TaskName kept', () => {
    const read = (json: object) => readEegSidecar(Buffer.from(JSON.stringify(json)), 'e.json');
    expect(read({ TaskName: 'rest', PowerLineFrequency: 50 })).toEqual({
      taskName: 'rest',
      lineFrequencyHz: 50,
    });
    expect(read({ TaskName: 'x', PowerLineFrequency: 'n/a' }).lineFrequencyHz).toBeNull();
    expect(() => read({ PowerLineFrequency: 55 })).toThrow(/PowerLineFrequency 55 found/);
    expect(() => readEegSidecar(Buffer.from('[1]'), 'e.json')).toThrow(SidecarError);
  });

  it('scans.tsv: acq_time gives each file its date', () => {
    const dates = scanDates(
      tsv('filename\tacq_time', 'eeg/sub-01_ses-a_task-rest_eeg.edf\t2026-03-02T09:10:00'),
      's.tsv',
    );
    expect([...dates]).toEqual([['sub-01_ses-a_task-rest_eeg.edf', '2026-03-02']]);
  });

  it('the task suggests the kind (task-rest, TaskName "resting state" → resting)', () => {
    expect(kindOfTask('rest', null)).toBe('resting');
    expect(kindOfTask('eyesclosed', 'Resting state, eyes closed')).toBe('resting');
    expect(kindOfTask('oddball', 'auditory oddball')).toBe('task');
  });
});
