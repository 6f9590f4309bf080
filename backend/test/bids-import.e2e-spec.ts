/**
 * EEG-BIDS import through the real API on a temporary DATA_DIR (real SQLite file, the real
 * validation lane). The BIDS folders are generated here: recordings by the signal core's EDF
 * writer (recordings-fixtures.ts), sidecars written as the BIDS specification's EEG section
 * describes them (bids-specification.readthedocs.io: "Electroencephalography", "Common
 * principles"): `*_events.tsv` (onset, duration, trial_type), `*_channels.tsv` (name, type,
 * units, status, status_description), `*_eeg.json` (TaskName, PowerLineFrequency, …) and
 * `*_scans.tsv` (filename, acq_time).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { zipSync } from 'fflate';
import request from 'supertest';
import type { BidsImportFilePreview, BidsImportPreview } from '@gyre/shared';
import { assembleBdf, plainBdfParts } from '../src/signal/edf/testing/hand-built-bdf';
import { importFootprint, sqlRows } from './helpers/sqlite-rows';
import { type TestApp, useTestApp } from './helpers/test-app';
import type { UserKey } from './helpers/seed';
import {
  INVENTED_PATIENT_NAME,
  syntheticRestEdf,
  syntheticTaskEdf,
  TASK_CHANNELS,
} from './recordings-fixtures';

type Folder = Record<string, Uint8Array | string>;

interface SendOptions {
  dryRun?: boolean;
  createParticipants?: boolean;
  asZip?: boolean;
  visitDate?: string;
}

/** form-data (under supertest) keeps a part's folders only as `filepath`, which superagent's types omit. */
const withPath = (path: string) => ({ filepath: path }) as unknown as { filename?: string };

async function send(
  t: TestApp,
  user: UserKey,
  folder: Folder,
  options: SendOptions = {},
): Promise<request.Response> {
  let req = request(t.url)
    .post(
      `/api/studies/${t.seed.studies.A.id}/bids-imports${options.dryRun === true ? '?dryRun=true' : ''}`,
    )
    .set(await t.authHeader(user));
  if (options.createParticipants === true) req = req.field('createParticipants', 'true');
  if (options.visitDate !== undefined) req = req.field('visitDate', options.visitDate);
  if (options.asZip === true) {
    const entries = Object.fromEntries(
      Object.entries(folder).map(([path, bytes]) => [
        path,
        typeof bytes === 'string' ? new TextEncoder().encode(bytes) : bytes,
      ]),
    );
    return req.attach('archive', Buffer.from(zipSync(entries)), 'session.zip');
  }
  for (const [path, bytes] of Object.entries(folder)) {
    // A browser folder drop sends each file's path in the folder as its file name.
    req = req.attach('files', Buffer.from(bytes), withPath(path));
  }
  return req;
}

/** Everything an import writes, participants, visit overrides and BIDS file rows included. */
const footprint = (t: TestApp) =>
  importFootprint(t, {
    participants: 'participant',
    overrides: 'visit_analysis_override',
    bidsFiles: 'bids_import_file',
  });

/** `*_channels.tsv`: name, type, units required; status and status_description optional. */
function channelsTsv(bad: Record<string, string>): string {
  const rows = TASK_CHANNELS.map((label) => {
    const name = /EEG (\w+)-REF/.exec(label)?.[1] ?? label;
    const reason = bad[name];
    return [label, 'EEG', 'uV', reason === undefined ? 'good' : 'bad', reason ?? 'n/a'].join('\t');
  });
  return ['name\ttype\tunits\tstatus\tstatus_description', ...rows].join('\n') + '\n';
}

/** `*_eeg.json`: TaskName and PowerLineFrequency are REQUIRED (EEG section). */
function eegJson(taskName: string, powerLine: number | 'n/a'): string {
  return JSON.stringify({
    TaskName: taskName,
    PowerLineFrequency: powerLine,
    SamplingFrequency: 256,
    EEGReference: 'REF',
    SoftwareFilters: 'n/a',
  });
}

const ODDBALL_EVENTS: Array<[number, string]> = [
  [3, 'target'],
  [7, 'standard'],
  [11, 'target'],
  [15, 'standard'],
];

/** `*_events.tsv`: onset and duration REQUIRED (seconds), trial_type OPTIONAL. */
function eventsTsv(
  events: Array<[number, string]>,
  columns = 'onset\tduration\ttrial_type',
): string {
  return [columns, ...events.map(([onset, type]) => `${onset}\t0.5\t${type}`)].join('\n') + '\n';
}

/** One subject's session: a resting and an oddball task recording with their sidecars. */
function session(sub: string, ses: string, seed: number, top = 'dataset'): Folder {
  const dir = `${top}/sub-${sub}/ses-${ses}/eeg`;
  const stem = `sub-${sub}_ses-${ses}`;
  return {
    [`${dir}/${stem}_task-rest_eeg.edf`]: syntheticRestEdf({ durationS: 20, seed }),
    [`${dir}/${stem}_task-rest_eeg.json`]: eegJson('rest', 50),
    [`${dir}/${stem}_task-rest_channels.tsv`]: channelsTsv({ O2: 'electrode bridged' }),
    [`${dir}/${stem}_task-oddball_eeg.edf`]: syntheticTaskEdf({
      durationS: 20,
      seed: seed + 1,
      annotate: false,
    }),
    [`${dir}/${stem}_task-oddball_eeg.json`]: eegJson('auditory oddball', 60),
    [`${dir}/${stem}_task-oddball_events.tsv`]: eventsTsv(ODDBALL_EVENTS),
    [`${top}/sub-${sub}/ses-${ses}/${stem}_scans.tsv`]: [
      'filename\tacq_time',
      `eeg/${stem}_task-rest_eeg.edf\t2026-01-02T09:00:00`,
      `eeg/${stem}_task-oddball_eeg.edf\t2026-01-02T09:20:00`,
    ].join('\n'),
  };
}

const fileOf = (preview: BidsImportPreview, task: string): BidsImportFilePreview =>
  preview.files.find((f) => f.task === task) as BidsImportFilePreview;

describe('EEG-BIDS import', () => {
  const t = useTestApp();

  beforeAll(async () => {
    const admin = await t.authHeader('admin');
    for (const [name, targetDay] of [
      ['Baseline', 0],
      ['Week 4', 28],
    ] as const) {
      const res = await request(t.url)
        .post(`/api/studies/${t.seed.studies.A.id}/planned-visits`)
        .set(admin)
        .send({ name, targetDay, windowBeforeDays: 3, windowAfterDays: 3 });
      expect(res.status).toBe(201);
    }
  });

  const good = session('A10001', 'baseline', 41);

  it('preview (dry run): every file mapped, read and checked; nothing stored', async () => {
    await t.authHeader('technician'); // signing in is audited: before the footprint
    const before = footprint(t);
    const res = await send(t, 'technician', good, { dryRun: true });
    expect(res.status).toBe(200);
    const preview = res.body as BidsImportPreview;
    expect(preview).toMatchObject({ dryRun: true, imported: false, problems: [] });
    expect(preview.summary).toEqual({
      files: 2,
      withProblems: 0,
      newParticipants: 0,
      newVisits: 1,
    });
    const rest = fileOf(preview, 'rest');
    const oddball = fileOf(preview, 'oddball');
    // sub-A10001 ↔ participant A1-0001, ses-baseline ↔ planned visit Baseline; the visit date is
    // the acq_time of the scans file (Common principles, "Scans file").
    for (const file of [rest, oddball]) {
      expect(file).toMatchObject({
        subject: 'A10001',
        participantCode: 'A1-0001',
        participant: 'existing',
        session: 'baseline',
        plannedVisit: 'Baseline',
        visit: 'new',
        visitDate: '2026-01-02',
        problems: [],
      });
    }
    // task-rest → resting; TaskName "auditory oddball" → task (EEG section: TaskName).
    expect(rest).toMatchObject({ kind: 'resting', taskName: 'rest', lineFrequencyHz: 50 });
    expect(rest.channelsLeftOut).toEqual([{ label: 'EEG O2-REF', reason: 'electrode bridged' }]);
    expect(rest.onsetCount).toBeNull();
    // events.tsv: four rows → four onsets, trial_type → the condition labels.
    expect(oddball).toMatchObject({ kind: 'task', lineFrequencyHz: 60, onsetCount: 4 });
    expect(oddball.conditions.sort()).toEqual(['standard', 'target']);
    expect(oddball.channelsLeftOut).toEqual([]);
    expect(footprint(t)).toEqual(before);
  });

  it('confirm: recordings queued with the events as onsets, the bad channel left out, line frequency kept', async () => {
    const res = await send(t, 'technician', good);
    expect(res.status).toBe(201);
    const preview = res.body as BidsImportPreview;
    expect(preview.imported).toBe(true);
    const recordings = sqlRows<{
      id: string;
      kind: string;
      state: string;
      visitId: string;
      csvOnsetsJson: string | null;
      fileName: string;
      storedFile: string;
    }>(
      t,
      `SELECT id, kind, state, visitId, csvOnsetsJson, fileName, storedFile FROM recording WHERE id IN ('${preview.files.map((f) => f.recordingId).join("','")}')`,
    );
    expect(recordings.map((r) => r.kind).sort()).toEqual(['resting', 'task']);
    // Accepted and queued; the computation may already have claimed them.
    for (const r of recordings) expect(['queued', 'computing', 'ready']).toContain(r.state);
    const task = recordings.find((r) => r.kind === 'task');
    // The onsets are the events file's onset column with trial_type as label.
    expect(
      (JSON.parse(task?.csvOnsetsJson ?? '[]') as Array<{ onsetS: number; label: string }>).map(
        (o) => [o.onsetS, o.label],
      ),
    ).toEqual(ODDBALL_EVENTS);
    expect(task?.fileName).toBe('sub-A10001_ses-baseline_task-oddball_eeg.edf');
    // Stored like any upload: the identifying header fields blanked.
    const stored = readFileSync(join(t.config.uploadsDir, task?.storedFile ?? ''));
    expect(stored.includes(Buffer.from(INVENTED_PATIENT_NAME))).toBe(false);

    const visitId = recordings[0].visitId;
    const visit = sqlRows<{ label: string; visitDate: string; participantId: string }>(
      t,
      `SELECT label, visitDate, participantId FROM visit WHERE id = '${visitId}'`,
    )[0];
    expect(visit).toEqual({
      label: 'Baseline',
      visitDate: '2026-01-02',
      participantId: t.seed.participants.A1.id,
    });
    const rows = sqlRows<{ task: string; lineFrequencyHz: number | null; badChannelsJson: string }>(
      t,
      `SELECT task, lineFrequencyHz, badChannelsJson FROM bids_import_file ORDER BY task`,
    );
    expect(rows.map((r) => [r.task, r.lineFrequencyHz, JSON.parse(r.badChannelsJson)])).toEqual([
      ['oddball', 60, []],
      ['rest', 50, [{ label: 'EEG O2-REF', reason: 'electrode bridged' }]],
    ]);
    // The sidecar's PowerLineFrequency travels with each recording (EEG-BIDS `*_eeg.json`).
    const listed = await request(t.url)
      .get(`/api/recordings?visitId=${visitId}`)
      .set(await t.authHeader('analyst'));
    expect(listed.status).toBe(200);
    expect(
      (listed.body.items as Array<{ kind: string; lineFrequencyHz: number | null }>)
        .map((r) => [r.kind, r.lineFrequencyHz])
        .sort(),
    ).toEqual([
      ['resting', 50],
      ['task', 60],
    ]);
    // The bad channel leaves the visit's region of interest, with the file's reason.
    const override = await request(t.url)
      .get(`/api/visits/${visitId}/analysis-override`)
      .set(await t.authHeader('analyst'));
    expect(override.status).toBe(200);
    expect(override.body.roi).not.toContain('O2');
    expect(override.body.roi).toContain('O1');
    expect(override.body.reason).toBe('EEG-BIDS channels.tsv marks bad: O2 (electrode bridged)');
    const audit = sqlRows<{ action: string }>(
      t,
      `SELECT action FROM audit_entry WHERE objectId IN ('${t.seed.studies.A.id}', '${visitId}') ORDER BY seq`,
    ).map((a) => a.action);
    expect(audit).toEqual(expect.arrayContaining(['create', 'update', 'bids-import']));
  });

  /** A refused import: the status, the problem named, and nothing stored. */
  async function refused(
    user: UserKey,
    folder: Folder,
    status: number,
    problem: RegExp,
    options: SendOptions = {},
  ): Promise<void> {
    await t.authHeader(user);
    const before = footprint(t);
    const res = await send(t, user, folder, options);
    expect(res.status).toBe(status);
    expect(res.body.message).toMatch(problem);
    expect(footprint(t)).toEqual(before);
  }

  it('the same session again is a duplicate session: 422, nothing stored', async () => {
    await refused('technician', good, 422, /duplicate session: This file .* is already recording/);
  });

  it('two resting recordings of one session: 422 naming the duplicate', async () => {
    const twice = {
      ...session('A10001', 'week4', 51),
      'dataset/sub-A10001/ses-week4/eeg/sub-A10001_ses-week4_task-rest_run-2_eeg.edf':
        syntheticRestEdf({ durationS: 20, seed: 53 }),
    };
    await refused(
      'technician',
      twice,
      422,
      /duplicate session: .*task-rest_eeg\.edf already brings the resting recording/,
    );
  });

  it('a session without its recording: 422 naming the missing eeg file', async () => {
    const sidecarsOnly = Object.fromEntries(
      Object.entries(session('A10001', 'week4', 61)).filter(([path]) => !path.endsWith('.edf')),
    );
    await refused('technician', sidecarsOnly, 422, /no \*_eeg\.edf or \*_eeg\.bdf found/);
  });

  it('events.tsv without an onset column: 422 naming the column', async () => {
    const folder = session('A10001', 'week4', 71);
    folder['dataset/sub-A10001/ses-week4/eeg/sub-A10001_ses-week4_task-oddball_events.tsv'] =
      eventsTsv(ODDBALL_EVENTS, 'start\tduration\ttrial_type');
    await refused('technician', folder, 422, /events\.tsv: no 'onset' column found/);
  });

  it('an unknown subject when participants may not be created: 422 naming it', async () => {
    await refused(
      'technician',
      session('ZZ0099', 'baseline', 81),
      422,
      /sub-ZZ0099: no participant ZZ0099/,
    );
  });

  it('another site’s participant: 422, and a monitor may not import at all (403)', async () => {
    await refused(
      'technicianA2',
      session('A10001', 'week4', 91),
      422,
      /belongs to a site you do not upload for/,
    );
    await refused('monitor', session('A10001', 'week4', 91), 403, /./);
  });

  it('zip slip: a path with ../ is refused before anything is written (400)', async () => {
    const evil = {
      '../sub-A10001/ses-week4/eeg/sub-A10001_ses-week4_task-rest_eeg.edf': syntheticRestEdf({
        durationS: 20,
        seed: 95,
      }),
    };
    await refused('technician', evil, 400, /'\.\.' or '\.' segment/);
    await refused('technician', evil, 400, /'\.\.' or '\.' segment/, { asZip: true });
  });

  it('a zip with a new subject, participants allowed to be created: imported', async () => {
    const before = footprint(t);
    const res = await send(t, 'technician', session('A1NEW7', 'baseline', 101, 'export'), {
      asZip: true,
      createParticipants: true,
    });
    expect(res.status).toBe(201);
    const preview = res.body as BidsImportPreview;
    expect(preview.summary).toMatchObject({ files: 2, newParticipants: 1, newVisits: 1 });
    expect(preview.files.every((f) => f.participantCode === 'A1NEW7')).toBe(true);
    const after = footprint(t);
    expect(after.participants).toBe(before.participants + 1);
    expect(after.recordings).toBe(before.recordings + 2);
    const created = sqlRows<{ siteId: string }>(
      t,
      `SELECT siteId FROM participant WHERE code = 'A1NEW7'`,
    );
    expect(created).toEqual([{ siteId: t.seed.sites.A1.id }]);
  });

  it('a *_eeg.bdf recording (BDF, 24-bit) is checked by the same validation lane', async () => {
    // The plain BDF file written byte by byte to BioSemi's description (hand-built-bdf.ts).
    const dir = 'sub-A10001/ses-week4/eeg';
    const res = await send(
      t,
      'technician',
      {
        [`${dir}/sub-A10001_ses-week4_task-rest_eeg.bdf`]: assembleBdf(plainBdfParts()),
        [`${dir}/sub-A10001_ses-week4_task-rest_eeg.json`]: eegJson('rest', 'n/a'),
      },
      { dryRun: true, visitDate: '2026-01-29' },
    );
    expect(res.status).toBe(200);
    const file = (res.body as BidsImportPreview).files[0];
    // No scans.tsv: the visit date given with the form dates the new visit.
    expect(file).toMatchObject({
      kind: 'resting',
      lineFrequencyHz: null,
      visit: 'new',
      visitDate: '2026-01-29',
      problems: [],
    });
    expect(file.warnings).toEqual([
      'PowerLineFrequency is n/a: both line-noise checks (50 and 60 Hz) apply',
    ]);
    // The same file cut short: refused by the reader, named on the file.
    const whole = assembleBdf(plainBdfParts());
    const cut = await send(
      t,
      'technician',
      {
        [`${dir}/sub-A10001_ses-week4_task-rest_eeg.bdf`]: whole.slice(0, whole.length - 5),
        [`${dir}/sub-A10001_ses-week4_task-rest_eeg.json`]: eegJson('rest', 50),
      },
      { dryRun: true, visitDate: '2026-01-29' },
    );
    expect((cut.body as BidsImportPreview).files[0].problems).toEqual([
      expect.stringMatching(/^RECORDING_REJECTED: /),
    ]);
  });
});
