/**
 * Bulk upload with a CSV manifest, through the real API on a temporary DATA_DIR (real SQLite
 * file, the real validation lane). Every recording is generated (recordings-fixtures.ts).
 */
import request from 'supertest';
import type { BulkUploadReport, BulkUploadRowReport } from '@gyre/shared';
import { importFootprint, sqlRows, uploadFolder } from './helpers/sqlite-rows';
import { type TestApp, useTestApp } from './helpers/test-app';
import type { UserKey } from './helpers/seed';
import { syntheticRestEdf, syntheticTaskEdf } from './recordings-fixtures';

const HEADER = 'participant_code,planned_visit,kind,file,onsets_file,visit_date,confirm_kind';

interface Part {
  name: string;
  bytes: Uint8Array | string;
}

async function bulk(
  t: TestApp,
  user: UserKey,
  manifest: string,
  files: Part[],
  options: { dryRun?: boolean; studyId?: string } = {},
): Promise<request.Response> {
  let req = request(t.url)
    .post(
      `/api/studies/${options.studyId ?? t.seed.studies.A.id}/bulk-uploads${options.dryRun === true ? '?dryRun=true' : ''}`,
    )
    .set(await t.authHeader(user))
    .attach('manifest', Buffer.from(manifest), 'manifest.csv');
  for (const file of files) req = req.attach('files', Buffer.from(file.bytes), file.name);
  return req;
}

const footprint = (t: TestApp) => importFootprint(t, {});

function maxSeq(t: TestApp): number {
  return sqlRows<{ n: number | null }>(t, 'SELECT max(seq) AS n FROM audit_entry')[0].n ?? 0;
}

const rowOf = (report: BulkUploadReport, row: number): BulkUploadRowReport =>
  report.rows.find((r) => r.row === row) as BulkUploadRowReport;

describe('bulk upload with a CSV manifest', () => {
  const t = useTestApp();
  // Distinct generated files (seeds differ, so their checksums do).
  const rest1 = syntheticRestEdf({ durationS: 20, seed: 31 });
  const rest2 = syntheticRestEdf({ durationS: 20, seed: 32 });
  const task1 = syntheticTaskEdf({ durationS: 20, seed: 33 });
  const taskNoOnsets = syntheticTaskEdf({ durationS: 20, seed: 34, annotate: false });
  const onsetsCsv = 'onset_s,label\n3,stim\n7,stim\n11,stim\n';
  let baselineId: string;
  let week4Id: string;

  beforeAll(async () => {
    const admin = await t.authHeader('admin');
    const studyA = t.seed.studies.A.id;
    const create = async (name: string, targetDay: number) => {
      const res = await request(t.url)
        .post(`/api/studies/${studyA}/planned-visits`)
        .set(admin)
        .send({ name, targetDay, windowBeforeDays: 3, windowAfterDays: 3 });
      expect(res.status).toBe(201);
      return (res.body as { id: string }).id;
    };
    baselineId = await create('Baseline', 0);
    week4Id = await create('Week 4', 28);
    for (const [site, user] of [
      ['A1', 'technician'],
      ['A2', 'technicianA2'],
    ] as const) {
      const res = await request(t.url)
        .patch(`/api/participants/${t.seed.participants[site].id}`)
        .set(await t.authHeader(user))
        .send({ enrolmentDate: '2026-01-01' });
      expect(res.status).toBe(200);
    }
  });

  const goodManifest = [
    HEADER,
    // New visit at Baseline, in window (study day 1, window 0 ± 3).
    'A1-0001,Baseline,resting,rest1.edf,,2026-01-02,',
    'A1-0001,Baseline,task,task1.edf,,2026-01-02,',
    // New visit at Week 4 on study day 40: outside the window 28 ± 3 → a warning, not an error.
    'A1-0001,Week 4,resting,rest2.edf,,2026-02-10,',
    // A task file without annotations, with its onset CSV.
    'A1-0001,Week 4,task,task-plain.edf,onsets.csv,2026-02-10,',
  ].join('\n');
  const goodFiles: Part[] = [
    { name: 'rest1.edf', bytes: rest1 },
    { name: 'task1.edf', bytes: task1 },
    { name: 'rest2.edf', bytes: rest2 },
    { name: 'task-plain.edf', bytes: taskNoOnsets },
    { name: 'onsets.csv', bytes: onsetsCsv },
  ];

  it('dry run: reports every row and changes nothing', async () => {
    const before = footprint(t);
    const res = await bulk(t, 'technician', goodManifest, goodFiles, { dryRun: true });
    expect(res.status).toBe(200);
    const report = res.body as BulkUploadReport;
    expect(report).toMatchObject({ dryRun: true, imported: false, strayFiles: [] });
    expect(report.summary).toEqual({ rows: 4, ok: 2, warnings: 2, errors: 0, newVisits: 2 });
    expect([3, 4].map((n) => rowOf(report, n).status)).toEqual(['warning', 'warning']);
    // 2026-01-01 → 2026-02-10 is 40 days (calendar arithmetic); 40 − 28 = 12 > 3 days after.
    expect(rowOf(report, 3).warnings[0]).toContain('late for Week 4: study day 40, target day 28');
    expect(report.rows.every((r) => r.recordingId === null)).toBe(true);
    expect(footprint(t)).toEqual(before);
  });

  it('one bad row: 422 naming it, and nothing is written (rows, files, temporary files)', async () => {
    const before = footprint(t);
    const manifest = goodManifest.replace('task-plain.edf,onsets.csv', 'task-plain.edf,');
    const res = await bulk(
      t,
      'technician',
      manifest,
      goodFiles.filter((f) => f.name !== 'onsets.csv'),
    );
    expect(res.status).toBe(422);
    expect(res.body.code).toBe('BULK_UPLOAD_ROWS_INVALID');
    const report = res.body.details.report as BulkUploadReport;
    expect(report.summary).toMatchObject({ rows: 4, errors: 1 });
    expect(rowOf(report, 4).status).toBe('error');
    // The recordings module's kind check: a task file without any onset.
    expect(rowOf(report, 4).errors[0]).toMatch(
      /^RECORDING_KIND_UNCONFIRMED: kind: this file has no stimulus onsets/,
    );
    expect([1, 2, 3].map((n) => rowOf(report, n).status)).toEqual(['ok', 'ok', 'warning']);
    expect(rowOf(report, 4).warnings).toHaveLength(1);
    expect(footprint(t)).toEqual(before);
  });

  it('reports each kind of bad row on its own line', async () => {
    const before = footprint(t);
    const broken = Buffer.from(rest1).subarray(0, 700); // a header cut short: not EDF
    const manifest = [
      HEADER,
      'A9-9999,Baseline,resting,rest1.edf,,2026-01-02,', // 1 unknown participant
      'A1-0001,Week 9,resting,rest1.edf,,2026-01-02,', // 2 unknown planned visit, same file again
      'A1-0001,Baseline,eyes-open,task1.edf,,2026-01-02,', // 3 kind invalid
      'A1-0001,Baseline,task,missing.edf,,2026-01-02,', // 4 file not uploaded
      'A1-0001,Baseline,resting,rest2.edf,,2026-01-02,', // 5 fine on its own
      'A1-0001,Baseline,resting,broken.edf,,2026-01-02,', // 6 duplicate of row 5's slot
      'A2-0001,Baseline,resting,broken.edf,,2026-01-02,', // 7 other site (and the file again)
      'A1-0001,Week 4,task,broken2.edf,,,', // 8 no visit yet and no visit_date
      'A1-0001,Week 4,resting,broken3.edf,,2026-02-01,', // 9 not an EDF file
    ].join('\n');
    const res = await bulk(t, 'technician', manifest, [
      { name: 'rest1.edf', bytes: rest1 },
      { name: 'task1.edf', bytes: task1 },
      { name: 'rest2.edf', bytes: rest2 },
      { name: 'broken.edf', bytes: broken },
      { name: 'broken2.edf', bytes: Buffer.concat([broken, Buffer.from('x')]) },
      { name: 'broken3.edf', bytes: Buffer.concat([broken, Buffer.from('yz')]) },
      { name: 'extra.edf', bytes: rest1 },
    ]);
    expect(res.status).toBe(422);
    const report = res.body.details.report as BulkUploadReport;
    const errors = (n: number) => rowOf(report, n).errors.join(' | ');
    expect(errors(1)).toContain('participant_code: no participant A9-9999 in this study');
    expect(errors(2)).toContain("planned_visit: 'Week 9' found, one of Baseline, Week 4 expected");
    expect(errors(2)).toContain('file: rest1.edf is already named by row 1');
    expect(errors(3)).toContain("kind: 'eyes-open' found, one of resting, task expected");
    expect(errors(4)).toContain('file: missing.edf is not among the uploaded files');
    expect(rowOf(report, 5).status).toBe('ok');
    expect(errors(6)).toContain(
      'duplicate row: row 5 already uploads the resting recording of A1-0001 at Baseline',
    );
    expect(errors(7)).toContain('A2-0001 belongs to a site you do not upload for');
    expect(errors(8)).toContain('visit_date: A1-0001 has no visit at Week 4 yet');
    expect(errors(9)).toMatch(/^RECORDING_REJECTED: /);
    expect(report.strayFiles).toEqual([
      { file: 'extra.edf', message: 'extra.edf was uploaded but no manifest row names it' },
    ]);
    expect(footprint(t)).toEqual(before);
  });

  it('imports every row in one go: N recordings and jobs, the new visits, the audit entries', async () => {
    const lastSeq = maxSeq(t);
    const before = footprint(t);
    const res = await bulk(t, 'technician', goodManifest, goodFiles);
    expect(res.status).toBe(201);
    const report = res.body as BulkUploadReport;
    expect(report.imported).toBe(true);
    const after = footprint(t);
    expect(after.recordings - before.recordings).toBe(4);
    expect(after.jobs - before.jobs).toBe(4);
    expect(after.visits - before.visits).toBe(2);
    expect(after.stored).toHaveLength(4);
    expect(after.temporary).toEqual([]);
    const ids = report.rows.map((r) => r.recordingId);
    expect(new Set(ids).size).toBe(4);
    for (const row of report.rows) {
      const got = await request(t.url)
        .get(`/api/recordings/${row.recordingId}`)
        .set(await t.authHeader('technician'));
      expect(got.status).toBe(200);
      expect(got.body.visitId).toBe(row.visitId);
      // The name the file had in the upload, as the manifest named it.
      expect(got.body.fileName).toBe(row.file);
      expect(['queued', 'computing', 'ready']).toContain(got.body.state);
    }
    // Rows 1–2 share the Baseline visit, rows 3–4 the Week 4 one, on its planned visit.
    expect(rowOf(report, 1).visitId).toBe(rowOf(report, 2).visitId);
    const visit = await request(t.url)
      .get(`/api/visits/${rowOf(report, 3).visitId}`)
      .set(await t.authHeader('technician'));
    expect(visit.body).toMatchObject({
      plannedVisitId: week4Id,
      visitDate: '2026-02-10',
      label: 'Week 4',
    });
    expect(rowOf(report, 1).visit).toBe('new');

    // Audit: as single uploads write (upload, validate, accept per recording), a create per
    // new visit, and one bulk-upload entry listing the rows.
    const audit = await request(t.url)
      .get('/api/audit?pageSize=100')
      .set(await t.authHeader('admin'));
    expect(audit.status).toBe(200);
    const entries = audit.body.items as Array<{
      action: string;
      objectType: string;
      objectId: string;
      actorEmail: string | null;
      seq: number;
      after: unknown;
    }>;
    for (const id of ids) {
      const actions = entries
        // The computation that starts at once adds its own moves (compute, ready).
        .filter((e) => e.objectId === id && ['upload', 'validate', 'accept'].includes(e.action))
        .map((e) => e.action)
        .sort();
      expect(actions).toEqual(['accept', 'upload', 'validate']);
    }
    expect(entries.filter((e) => e.objectType === 'Visit' && e.action === 'create')).toHaveLength(
      2,
    );
    const bulkEntries = entries.filter((e) => e.action === 'bulk-upload');
    expect(bulkEntries).toHaveLength(1);
    const listed = (bulkEntries[0].after as { rows: Array<{ row: number; recordingId: string }> })
      .rows;
    expect(listed.map((r) => r.recordingId)).toEqual(ids);
    // Nothing else: only these 4 × 3 + 2 + 1 entries name the technician since the import.
    const sinceImport = entries.filter(
      (e) => e.seq > lastSeq && e.actorEmail === 'technician@gyre.test',
    );
    expect(sinceImport).toHaveLength(4 * 3 + 2 + 1);
  });

  it('does not replace: a current recording of the kind makes the row an error', async () => {
    // The imported recordings compute meanwhile (and a task may be queued again once its
    // visit's resting IAF appears), so jobs are left out here.
    const { jobs: _jobs, ...before } = footprint(t);
    const res = await bulk(
      t,
      'technician',
      [HEADER, 'A1-0001,Baseline,resting,again.edf,,,'].join('\n'),
      [{ name: 'again.edf', bytes: syntheticRestEdf({ durationS: 20, seed: 35 }) }],
    );
    expect(res.status).toBe(422);
    const row = rowOf(res.body.details.report as BulkUploadReport, 1);
    expect(row.visit).toBe('existing');
    expect(row.errors[0]).toContain('a bulk upload does not replace recordings');
    const { jobs: _after, ...after } = footprint(t);
    expect(after).toEqual(before);
  });

  // Admins manage studies, sites and accounts but hold no participant or recording rights
  // (shared/src/permissions.ts), so a bulk upload is a technician's, like a single upload.
  it('is for technicians of the study; others get 403, another study 404', async () => {
    const manifest = [HEADER, 'A1-0001,Baseline,resting,x.edf,,2026-01-01,'].join('\n');
    const files = [{ name: 'x.edf', bytes: rest1 }];
    expect((await bulk(t, 'analyst', manifest, files, { dryRun: true })).status).toBe(403);
    expect((await bulk(t, 'technicianB', manifest, files, { dryRun: true })).status).toBe(404);
    expect((await bulk(t, 'admin', manifest, files, { dryRun: true })).status).toBe(403);
    const own = await bulk(t, 'technicianA2', manifest.replace('A1-0001', 'A2-0001'), files, {
      dryRun: true,
    });
    expect(own.status).toBe(200);
    expect(rowOf(own.body as BulkUploadReport, 1)).toMatchObject({ status: 'ok', visit: 'new' });
    expect(baselineId).toBeTruthy();
  });
});

describe('bulk upload limits', () => {
  const t = useTestApp({
    env: {
      BULK_UPLOAD_MAX_ROWS: '2',
      BULK_UPLOAD_MAX_BYTES: '100000',
      UPLOAD_MAX_BYTES: '30000',
    },
  });

  it('refuses more rows than BULK_UPLOAD_MAX_ROWS with 422 naming the limit', async () => {
    const manifest = [HEADER, ...['a', 'b', 'c'].map((f) => `A1-0001,V1,resting,${f}.edf,,,`)].join(
      '\n',
    );
    const res = await bulk(t, 'technician', manifest, []);
    expect(res.status).toBe(422);
    expect(res.body.code).toBe('BULK_UPLOAD_TOO_MANY_ROWS');
    expect(res.body.message).toContain('3 rows found, at most 2');
  });

  const tmpFiles = (): string[] => uploadFolder(t).temporary;

  it('refuses more bytes than BULK_UPLOAD_MAX_BYTES with 413 naming the limit, leaving no file', async () => {
    // 12 s × 4 channels × 256 Hz × 2 bytes = 24,576 data bytes (+ header) per file: each is
    // under UPLOAD_MAX_BYTES (30,000), four together over BULK_UPLOAD_MAX_BYTES (100,000).
    const files = [1, 2, 3, 4].map((n) => ({
      name: `r${n}.edf`,
      bytes: syntheticRestEdf({ durationS: 12, seed: 40 + n }),
    }));
    const manifest = [HEADER, 'A1-0001,V1,resting,r1.edf,,,'].join('\n');
    const res = await bulk(t, 'technician', manifest, files);
    expect(res.status).toBe(413);
    expect(res.body.code).toBe('BULK_UPLOAD_TOO_LARGE');
    expect(res.body.message).toContain('BULK_UPLOAD_MAX_BYTES');
    expect(tmpFiles()).toEqual([]);
  });

  it('refuses one recording beyond UPLOAD_MAX_BYTES with 413 naming it', async () => {
    const manifest = [HEADER, 'A1-0001,V1,resting,long.edf,,,'].join('\n');
    const res = await bulk(t, 'technician', manifest, [
      { name: 'long.edf', bytes: syntheticRestEdf({ durationS: 20, seed: 50 }) },
    ]);
    expect(res.status).toBe(413);
    expect(res.body.message).toMatch(/^long\.edf: more than 30000 bytes sent.*UPLOAD_MAX_BYTES/);
    expect(tmpFiles()).toEqual([]);
  });

  it('refuses more files than two per row allowed, with 413 naming the limit', async () => {
    const files = [1, 2, 3, 4, 5].map((n) => ({
      name: `s${n}.csv`,
      bytes: 'onset_s,label\n1,x\n',
    }));
    const res = await bulk(
      t,
      'technician',
      [HEADER, 'A1-0001,V1,resting,r1.edf,,,'].join('\n'),
      files,
    );
    expect(res.status).toBe(413);
    expect(res.body.message).toBe(
      'files: more than 5 files sent, at most 5 accepted (a recording and an onset CSV per row of BULK_UPLOAD_MAX_ROWS, and the manifest)',
    );
  });

  it('answers 400 naming the part or column for a form without a manifest or a bad manifest', async () => {
    const noManifest = await request(t.url)
      .post(`/api/studies/${t.seed.studies.A.id}/bulk-uploads`)
      .set(await t.authHeader('technician'))
      .attach('files', Buffer.from('x'), 'a.edf');
    expect(noManifest.status).toBe(400);
    expect(noManifest.body.message).toContain("file part 'manifest': none found");
    const badColumn = await bulk(
      t,
      'technician',
      'participant_code,planned_visit,kind\nP,V1,task\n',
      [],
    );
    expect(badColumn.status).toBe(400);
    expect(badColumn.body).toMatchObject({
      code: 'BULK_UPLOAD_MANIFEST_INVALID',
      message:
        'manifest: column file missing; the header must name participant_code, planned_visit, kind, file',
    });
    expect(tmpFiles()).toEqual([]);
  });
});
