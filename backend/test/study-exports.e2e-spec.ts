/**
 * Study results exports on the real app (real SQLite file, real analyses of generated
 * recordings): results.csv parsed with csv-parse (RFC 4180), export.zip read with python3's
 * zipfile (outside the project), every number compared with what `GET
 * /api/recordings/:id/results` gives for the same run, the data dictionary and the BIDS
 * sidecars against the columns, file names and dataset_description.json against the BIDS
 * specification's rules, access per role, and one audit entry per download.
 *
 * Tolerance of the number checks: none. Each exported number must be the exact decimal string
 * the results API's JSON writes for it (ECMAScript Number::toString, which JSON.stringify
 * uses); a missing value is the empty field in the CSV and `n/a` in the TSVs.
 */
import { execFileSync } from 'node:child_process';
import { createHash, randomUUID } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { parse } from 'csv-parse/sync';
import request from 'supertest';
import type { AnalysisSettingsView, RecordingView, RecordingResultsView } from '@gyre/shared';
import { Visit } from '../src/visits/visit.entity';
import { readPdfText } from '../src/report-document/testing/read-pdf-text';
import { REPO } from './helpers/built-dist';
import type { UserKey } from './helpers/seed';
import { binaryBody } from './helpers/binary-body';
import { useTestApp } from './helpers/test-app';
import {
  INVENTED_PATIENT_NAME,
  syntheticRestEdf,
  syntheticTaskEdf,
  upload,
  waitForState,
} from './recordings-fixtures';

type Row = Record<string, string>;

/** The exact text JSON writes for a number; '' (CSV) or 'n/a' (TSV) for none. */
function text(value: number | null | undefined, missing: string): string {
  return value === null || value === undefined ? missing : JSON.stringify(value);
}

/** A row's confidence interval and p-value columns, as the results API gives them. */
function intervalOf(ciHz: [number, number] | null, pValue: number | null) {
  return { ci_low: ciHz?.[0] ?? null, ci_high: ciHz?.[1] ?? null, p_value: pValue };
}

/** The same columns for a measure that has no interval or p-value. */
const NO_INTERVAL = intervalOf(null, null);

/** What the results API says for one exported row. */
function expectedOf(results: RecordingResultsView, row: Row) {
  const run = results.run;
  if (row.measure === 'delta_f_cycles') {
    const cycles = results.task?.cycles;
    if (cycles === null || cycles === undefined) throw new Error('no cycle-by-cycle estimate');
    return {
      value: cycles.deltaFHz,
      ...intervalOf(cycles.ciHz, null),
      trials_kept: cycles.trialsUsed,
      trials_total: cycles.trialsTotal,
    };
  }
  if (row.scope === 'roi') {
    const value =
      row.measure === 'paf' ? run.pafHz : row.measure === 'cog' ? run.cogHz : run.roiDeltaFHz;
    const task = row.measure === 'delta_f';
    return {
      value,
      ...(task ? intervalOf(run.roiCiHz, run.roiPValue) : NO_INTERVAL),
      trials_kept: task ? run.trialsKept : null,
      trials_total: task ? run.trialsTotal : null,
    };
  }
  const channel = results.channels.find((c) => c.label === row.channel);
  if (channel === undefined) throw new Error(`no channel ${row.channel} in the results`);
  const value =
    row.measure === 'delta_f'
      ? channel.deltaFHz
      : row.measure === 'baseline_f'
        ? channel.baselineHz
        : channel.postHz;
  const delta = row.measure === 'delta_f';
  return {
    value,
    ...(delta ? intervalOf(channel.ciHz, channel.pValue) : NO_INTERVAL),
    trials_kept: channel.trials,
    trials_total: null,
  };
}

/** Checks one exported row's numbers and provenance against the results API, exactly. */
function expectRowMatches(results: RecordingResultsView, row: Row, missing: string): number {
  const expected = expectedOf(results, row);
  for (const [column, value] of Object.entries(expected)) {
    expect({ column, text: row[column] }).toEqual({ column, text: text(value, missing) });
  }
  const run = results.run;
  expect(row.run_id).toBe(run.id);
  expect(row.settings_version).toBe(text(run.settingsVersion, missing));
  expect(row.code_version).toBe(run.codeVersion);
  expect(row.input_sha256).toBe(run.inputChecksumSha256);
  expect(row.input_sha256).toBe(results.source.checksumSha256);
  expect(row.band_low_hz).toBe(text(run.bandHz[0], missing));
  expect(row.band_high_hz).toBe(text(run.bandHz[1], missing));
  expect(row.band_source).toBe(run.bandSource);
  expect(row.roi_status).toBe(run.roiUsage.status);
  expect(row.alpha_peak_prominence_db).toBe(text(results.rest?.prominenceDb, missing));
  const stale = run.staleSettings.length === 0 ? missing : run.staleSettings.join('; ');
  expect(row.stale_settings).toBe(stale);
  // Numbers compared: value, CI, p, two trial counts, settings version, band, prominence.
  return 11;
}

/** BIDS entity order (specification, Appendix "Entity table"): the entities used here. */
const ENTITY_ORDER = ['sub', 'ses', 'task', 'acq', 'ce', 'rec', 'dir', 'run', 'desc'];

/** Checks a BIDS file name: key-value entities in the table's order, alphanumeric labels. */
function expectBidsName(name: string): { entities: Record<string, string>; suffix: string } {
  const stem = name.replace(/\.(tsv|json)$/, '');
  const parts = stem.split('_');
  const suffix = parts.pop()!;
  expect(suffix).toMatch(/^[a-zA-Z0-9]+$/);
  const entities: Record<string, string> = {};
  let last = -1;
  for (const part of parts) {
    const [key, label, ...rest] = part.split('-');
    expect(rest).toEqual([]);
    // Common principles, "Entities": a label is alphanumeric.
    expect(label).toMatch(/^[a-zA-Z0-9]+$/);
    const at = ENTITY_ORDER.indexOf(key);
    expect(at).toBeGreaterThan(last);
    last = at;
    entities[key] = label;
  }
  return { entities, suffix };
}

function listFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? listFiles(path) : [path];
  });
}

const parseTsv = (content: string): Row[] =>
  parse(content, { delimiter: '\t', columns: true, quote: '"', relax_quotes: false });

/**
 * Conditions, their difference and the cycle-by-cycle estimate in the contract's shapes
 * (shared/src/analysis-depth.ts), generated test data written into one stored task run: the
 * exports must carry whatever the run holds, exactly.
 */
const DEPTH = {
  conditions: [
    {
      label: 'Tone',
      trialsKept: 9,
      trialsTotal: 10,
      baselineHz: 10.123456789,
      postHz: 9.7,
      deltaFHz: -0.423456789,
      ciHz: [-0.61, -0.2345678],
      pValue: 0.0039,
    },
    {
      label: 'Word',
      trialsKept: 10,
      trialsTotal: 10,
      baselineHz: 10.1,
      postHz: 10.05,
      deltaFHz: -0.05,
      ciHz: [-0.2, 0.1],
      pValue: 0.625,
    },
  ],
  conditionDifference: {
    first: 'Tone',
    second: 'Word',
    chosenBy: 'settings',
    differenceHz: -0.373456789,
    ciHz: [-0.6, -0.15],
    pValue: 0.0048,
    permutations: 5000,
    seed: 20190815,
  },
  conditionCurves: [],
  cycles: {
    baselineHz: 10.08,
    postHz: 9.9,
    deltaFHz: -0.18,
    ciHz: [-0.3, -0.05],
    trialsUsed: 17,
    trialsTotal: 19,
    burstCycleShare: 0.6,
    disagreementHz: 0.16,
    disagrees: true,
  },
};

describe('study results exports', () => {
  const t = useTestApp();
  let studyA: string;
  let monthSix: string;
  const recordingIds: string[] = [];
  const results = new Map<string, RecordingResultsView>();
  let workDir: string;

  async function compute(
    visitId: string,
    user: UserKey,
    kind: 'resting' | 'task',
    seed: number,
  ): Promise<void> {
    const bytes =
      kind === 'resting'
        ? syntheticRestEdf({ peakHz: 9.5 + seed / 10, seed })
        : syntheticTaskEdf({ durationS: 60, seed });
    const response = await upload(t, user, visitId, { kind, bytes });
    expect(response.status).toBe(201);
    const id = (response.body as RecordingView).id;
    await waitForState(t, user, id, ['ready']);
    recordingIds.push(id);
  }

  async function withDepth(recordingId: string): Promise<void> {
    const [run] = (await t.dataSource.query(
      `SELECT run."id", run."summaryJson", run."settingsJson" FROM "analysis_run" run
       JOIN "recording" r ON r."latestRunId" = run."id" WHERE r."id" = ?`,
      [recordingId],
    )) as Array<{ id: string; summaryJson: string; settingsJson: string }>;
    const summary = JSON.parse(run.summaryJson) as {
      task: Record<string, unknown>;
      channels: Array<Record<string, unknown>>;
    };
    Object.assign(summary.task, DEPTH);
    summary.channels.forEach((channel, i) => {
      channel.amplitudeGate = { percentile: 25, excludedSamples: 250 + i, totalSamples: 1000 };
    });
    const settings = JSON.parse(run.settingsJson) as Record<string, unknown>;
    settings.amplitudeGatePercentile = 25;
    settings.compareConditions = ['Tone', 'Word'];
    await t.dataSource.query(
      `UPDATE "analysis_run" SET "summaryJson" = ?, "settingsJson" = ? WHERE "id" = ?`,
      [JSON.stringify(summary), JSON.stringify(settings), run.id],
    );
  }

  /** A new settings version of study A: the current values with `changes` (an analyst's write). */
  async function changeSettings(changes: Record<string, unknown>, reason: string): Promise<void> {
    const settingsPath = `/api/studies/${studyA}/analysis-settings`;
    const analyst = await t.authHeader('analyst');
    const current = await request(t.url).get(settingsPath).set(analyst);
    expect(current.status).toBe(200);
    // The values the API gave, without the version's own fields (the change DTO forbids them).
    const {
      id: _id,
      studyId: _studyId,
      version: _version,
      changes: _changes,
      reason: _reason,
      createdById: _createdById,
      createdAt: _createdAt,
      ...values
    } = current.body as AnalysisSettingsView;
    const newer = await request(t.url)
      .post(settingsPath)
      .set(analyst)
      .send({ ...values, ...changes, reason });
    expect(newer.status).toBe(201);
  }

  async function download(path: string, user: UserKey): Promise<request.Response> {
    return request(t.url)
      .get(path)
      .set(await t.authHeader(user))
      .buffer(true)
      .parse(binaryBody);
  }

  /** A dated, never-cached download of study A: `gyre-<code>-<name>-YYYY-MM-DD.<ext>`. */
  function expectStudyDownload(
    response: request.Response,
    contentType: RegExp,
    name: string,
    extension: 'csv' | 'zip',
  ): void {
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(contentType);
    expect(response.headers['content-disposition']).toMatch(
      new RegExp(
        `^attachment; filename="gyre-${t.seed.studies.A.code}-${name}-\\d{4}-\\d{2}-\\d{2}\\.${extension}"$`,
      ),
    );
    expect(response.headers['cache-control']).toBe('no-store');
  }

  beforeAll(async () => {
    workDir = mkdtempSync(join(tmpdir(), 'gyre-exports-test-'));
    studyA = t.seed.studies.A.id;
    const admin = await t.authHeader('admin');
    // The study's schedule: a group whose name starts like a formula, and a planned visit.
    const group = await request(t.url)
      .post(`/api/studies/${studyA}/groups`)
      .set(admin)
      .send({ name: '+Arm B, "open"' });
    expect(group.status).toBe(201);
    const planned = await request(t.url)
      .post(`/api/studies/${studyA}/planned-visits`)
      .set(admin)
      .send({ name: 'Month 6', targetDay: 180, windowBeforeDays: 14, windowAfterDays: 14 });
    expect(planned.status).toBe(201);
    const participant = await request(t.url)
      .patch(`/api/participants/${t.seed.participants.A1.id}`)
      .set(await t.authHeader('technician'))
      .send({
        enrolmentDate: '2026-01-10',
        groupId: (group.body as { id: string }).id,
        reason: 'Enrolment recorded from the site file',
      });
    expect(participant.status).toBe(200);
    // A second visit of A1-0001, on the planned visit (generated test data).
    const at = new Date().toISOString();
    const second: Visit = {
      ...t.seed.visits.A1,
      id: randomUUID(),
      label: 'Month 6',
      plannedVisitId: (planned.body as { id: string }).id,
      visitDate: '2026-07-20',
      createdAt: at,
      updatedAt: at,
    };
    await t.dataSource.getRepository(Visit).insert(second);
    monthSix = second.id;

    await compute(t.seed.visits.A1.id, 'technician', 'resting', 1);
    await compute(t.seed.visits.A1.id, 'technician', 'task', 2);
    // Month 6 has a task recording only: its Δf falls back to 8–13 Hz (a doubt marker).
    await compute(monthSix, 'technician', 'task', 3);
    await compute(t.seed.visits.A2.id, 'technicianA2', 'resting', 4);
    // Study B has numbers too, which no export of study A may hold.
    await compute(t.seed.visits.B1.id, 'technicianB', 'resting', 5);

    // The first task run as if computed with the amplitude gate at the 25th percentile and
    // "Tone" − "Word" compared: its settings, conditions, cross-check and per-channel gate.
    await withDepth(recordingIds[1]);

    // A newer settings version makes every run of study A "computed with older settings".
    await changeSettings({ postWindowS: [0.35, 0.95] }, 'Pilot review: later window after onset');

    const analyst = await t.authHeader('analyst');
    for (const id of recordingIds) {
      const response = await request(t.url).get(`/api/recordings/${id}/results`).set(analyst);
      if (response.status === 200) results.set(id, response.body as RecordingResultsView);
    }
  }, 240_000);

  afterAll(async () => {
    rmSync(workDir, { recursive: true, force: true });
  });

  it('results.csv: every number equals the results API, doubts and schedule as columns', async () => {
    const response = await download(`/api/studies/${studyA}/results.csv`, 'analyst');
    expectStudyDownload(response, /^text\/csv/, 'results', 'csv');
    const body = response.body as Buffer;
    // RFC 4180: CRLF line ends.
    expect(body.toString('utf8').split('\r\n')[0]).toMatch(/^study_code,site_code,/);
    const rows: Row[] = parse(body, { columns: true, record_delimiter: '\r\n' });
    const studyARecordings = recordingIds.slice(0, 4);
    expect(new Set(rows.map((r) => r.recording_id))).toEqual(new Set(studyARecordings));
    let compared = 0;
    for (const row of rows) {
      const api = results.get(row.recording_id)!;
      compared += expectRowMatches(api, row, '');
    }
    // Resting: paf and cog; task: ROI Δf + 3 per channel of the 4-channel files, and its
    // cycle-by-cycle Δf when the run has one.
    expect(rows).toHaveLength(2 + (1 + 3 * 4) + (1 + 3 * 4) + 2 + withCycles());
    expect(withCycles()).toBeGreaterThanOrEqual(1);
    expect(compared).toBe(rows.length * 11);
    // The schedule's columns (shared visitScheduleStatus: day 0 = 2026-01-10; 2026-07-20 is day 191).
    const month = rows.filter((r) => r.visit_label === 'Month 6');
    expect(month.length).toBeGreaterThan(0);
    for (const row of month) {
      expect(row).toMatchObject({
        planned_visit: 'Month 6',
        study_day: '191',
        days_from_target: '11',
        visit_window: 'in',
        enrolment_date: '2026-01-10',
        // A leading "+" is guarded against spreadsheet formulas; the quotes and comma survive.
        group: `'+Arm B, "open"`,
        band_source: 'default',
        missing_resting_iaf: 'true',
      });
    }
    const a2 = rows.filter((r) => r.participant_code === 'A2-0001');
    const a2Site = t.seed.sites.A2.code;
    expect(a2.map((r) => [r.site_code, r.group, r.visit_window])).toEqual([
      [a2Site, '', 'unplanned'],
      [a2Site, '', 'unplanned'],
    ]);
    // Every task run was computed with the older post window: the marker is on each of its
    // rows (a resting run does not use that window, so its rows carry none).
    const task = rows.filter((r) => r.recording_kind === 'task');
    expect(task.every((r) => /post window/i.test(r.stale_settings))).toBe(true);
    expect(rows.filter((r) => r.recording_kind === 'resting').map((r) => r.stale_settings)).toEqual(
      ['', '', '', ''],
    );
    // The default region names a channel the generated files lack: a partial region.
    const partial = rows.filter((r) => r.roi_status === 'partial');
    expect(partial.every((r) => /\((missing|flat|saturated)\)/.test(r.roi_channels_left_out))).toBe(
      true,
    );
    expectDepthColumns(rows, '');
    expect(body.toString('utf8')).not.toContain(INVENTED_PATIENT_NAME);
    expect(body.toString('utf8')).not.toContain('B1-0001');
    // The header names the payload's checksum; the audit entry repeats it (below).
    expect(response.headers['x-content-sha256']).toBe(
      createHash('sha256').update(body).digest('hex'),
    );
  });

  /** The cross-check, the gate and the depth settings of each recording's rows. */
  function expectDepthColumns(rows: Row[], missing: string): void {
    const gated = recordingIds[1];
    const api = results.get(gated)!;
    for (const row of rows.filter((r) => r.recording_id === gated)) {
      expect(row).toMatchObject({
        amplitude_gate_percentile: '25',
        cycle_disagreement_threshold_hz: '0.1',
        compare_conditions: 'Tone; Word',
        cycle_disagreement_hz: '0.16',
        cycles_disagree: 'true',
      });
    }
    // Per channel: its own share; the region's Δf row: the shares' total over the used channels.
    for (const row of rows.filter((r) => r.recording_id === gated && r.scope === 'channel')) {
      const gate = api.channels.find((c) => c.label === row.channel)!.amplitudeGate!;
      expect(row.gated_share).toBe(text(gate.excludedSamples / gate.totalSamples, missing));
    }
    const used = api.channels.filter((c) => api.run.roiUsage.used.includes(c.label));
    const excluded = used.reduce((sum, c) => sum + c.amplitudeGate!.excludedSamples, 0);
    const roiRow = rows.find(
      (r) => r.recording_id === gated && r.scope === 'roi' && r.measure === 'delta_f',
    )!;
    expect(roiRow.gated_share).toBe(text(excluded / (1000 * used.length), missing));
    const other = rows.filter((r) => r.recording_id !== gated);
    for (const row of other) {
      const cycles = results.get(row.recording_id)!.task?.cycles ?? null;
      expect(row).toMatchObject({
        amplitude_gate_percentile: missing,
        cycle_disagreement_threshold_hz: '0.1',
        compare_conditions: missing,
        gated_share: missing,
        cycles_disagree: cycles === null ? missing : String(cycles.disagrees),
        cycle_disagreement_hz: text(cycles?.disagreementHz, missing),
      });
    }
  }

  /** Study A's task recordings that carry the cycle-by-cycle estimate (one more row each). */
  function withCycles(): number {
    return recordingIds.slice(0, 4).filter((id) => (results.get(id)?.task?.cycles ?? null) !== null)
      .length;
  }

  /** Checks the conditions table's rows (CSV or TSV) against the results API, exactly. */
  function expectConditionRows(rows: Row[], missing: string): void {
    // Every condition of every task recording of study A, once; nothing of study B.
    const expected = recordingIds
      .slice(0, 4)
      .flatMap((id) => (results.get(id)?.task?.conditions ?? []).map((c) => `${id} ${c.label}`));
    expect(rows.map((r) => `${r.recording_id} ${r.condition}`).sort()).toEqual(expected.sort());
    for (const row of rows) {
      const api = results.get(row.recording_id)!;
      const condition = api.task!.conditions.find((c) => c.label === row.condition)!;
      const difference = api.task!.conditionDifference;
      expect(row).toEqual(
        expect.objectContaining({
          participant_code: 'A1-0001',
          run_id: api.run.id,
          trials_kept: text(condition.trialsKept, missing),
          trials_total: text(condition.trialsTotal, missing),
          baseline_f: text(condition.baselineHz, missing),
          post_f: text(condition.postHz, missing),
          delta_f: text(condition.deltaFHz, missing),
          ci_low: text(condition.ciHz?.[0], missing),
          ci_high: text(condition.ciHz?.[1], missing),
          p_value: text(condition.pValue, missing),
          difference_first: difference?.first ?? missing,
          difference_second: difference?.second ?? missing,
          difference_chosen_by: difference?.chosenBy ?? missing,
          difference_delta_f: text(difference?.differenceHz, missing),
          difference_ci_low: text(difference?.ciHz?.[0], missing),
          difference_ci_high: text(difference?.ciHz?.[1], missing),
          difference_p_value: text(difference?.pValue, missing),
          difference_permutations: text(difference?.permutations, missing),
          difference_seed: text(difference?.seed, missing),
        }),
      );
    }
    // The run given two conditions: both rows in their order, each with the pair's difference.
    const given = rows.filter((r) => r.recording_id === recordingIds[1]);
    expect(given.map((r) => [r.visit_label, r.condition])).toEqual([
      ['V1', 'Tone'],
      ['V1', 'Word'],
    ]);
    expect(given[1]).toMatchObject({
      difference_first: 'Tone',
      difference_second: 'Word',
      difference_chosen_by: 'settings',
      difference_permutations: '5000',
    });
    // The numbers are the run's, unrounded (−0.423456789 Hz written as JSON writes it).
    expect(given[0].delta_f).toBe('-0.423456789');
  }

  it('conditions.csv: one row per condition, the difference in columns, numbers as the results API', async () => {
    const response = await download(`/api/studies/${studyA}/conditions.csv`, 'analyst');
    expectStudyDownload(response, /^text\/csv/, 'conditions', 'csv');
    const body = response.body as Buffer;
    const rows: Row[] = parse(body, { columns: true, record_delimiter: '\r\n' });
    expectConditionRows(rows, '');
    const [entry] = (await t.dataSource.query(
      `SELECT "actorId", "after" FROM "audit_entry" WHERE "action" = 'export'
       ORDER BY "seq" DESC LIMIT 1`,
    )) as Array<{ actorId: string; after: string }>;
    expect(entry.actorId).toBe(t.seed.users.analyst.id);
    expect(JSON.parse(entry.after)).toMatchObject({
      export: 'conditions.csv',
      rows: rows.length,
      visits: new Set(rows.map((r) => r.visit_label)).size,
      sha256: createHash('sha256').update(body).digest('hex'),
    });
    expect(response.headers['x-content-sha256']).toBe(
      createHash('sha256').update(body).digest('hex'),
    );
  });

  it('results-dictionary.csv describes every column of results.csv, in order', async () => {
    const csv = await download(`/api/studies/${studyA}/results.csv`, 'monitor');
    const header = (csv.body as Buffer).toString('utf8').split('\r\n')[0].split(',');
    const dictionary = await download(`/api/studies/${studyA}/results-dictionary.csv`, 'monitor');
    expect(dictionary.status).toBe(200);
    const entries: Row[] = parse(dictionary.body as Buffer, { columns: true });
    expect(entries.map((e) => e.column)).toEqual(header);
    for (const entry of entries) {
      expect(entry.description.length).toBeGreaterThan(10);
      expect(['visit', 'recording', 'measure']).toContain(entry.level);
    }
    expect(entries.find((e) => e.column === 'value')?.unit).toBe('Hz');
  });

  it('export.zip: a BIDS derivatives folder whose numbers equal the results API', async () => {
    const response = await download(`/api/studies/${studyA}/export.zip`, 'admin');
    expectStudyDownload(response, /^application\/zip$/, 'derivatives', 'zip');
    const zipPath = join(workDir, 'export.zip');
    writeFileSync(zipPath, response.body as Buffer);
    const out = join(workDir, 'unzipped');
    // python3's zipfile (outside the project): CRCs checked, then every member extracted.
    const names = JSON.parse(
      execFileSync('python3', [
        '-c',
        [
          'import json, sys, zipfile',
          'z = zipfile.ZipFile(sys.argv[1])',
          'assert z.testzip() is None',
          'z.extractall(sys.argv[2])',
          'print(json.dumps(z.namelist()))',
        ].join('\n'),
        zipPath,
        out,
      ]).toString('utf8'),
    ) as string[];
    const root = join(out, `gyre-${t.seed.studies.A.code}-derivatives`);
    const files = listFiles(root).map((p) => relative(root, p).split('\\').join('/'));
    expect(names.length).toBe(files.length);

    // dataset_description.json (Derivatives, "Derived dataset and pipeline description").
    const description = JSON.parse(
      readFileSync(join(root, 'dataset_description.json'), 'utf8'),
    ) as Record<string, unknown>;
    const version = (
      JSON.parse(readFileSync(join(REPO, 'backend', 'package.json'), 'utf8')) as {
        version: string;
      }
    ).version;
    expect(description.DatasetType).toBe('derivative');
    expect(typeof description.Name).toBe('string');
    expect(description.BIDSVersion).toMatch(/^\d+\.\d+\.\d+$/);
    expect(description.GeneratedBy).toEqual([
      expect.objectContaining({ Name: 'Gyre', Version: version }),
    ]);

    // participants.tsv maps each participant code to its subject label, case-insensitively unique.
    const participants = parseTsv(readFileSync(join(root, 'participants.tsv'), 'utf8'));
    expect(participants.map((p) => [p.participant_id, p.participant_code])).toEqual([
      ['sub-A10001', 'A1-0001'],
      ['sub-A20001', 'A2-0001'],
    ]);
    const sessions = parseTsv(
      readFileSync(join(root, 'sub-A10001/sub-A10001_sessions.tsv'), 'utf8'),
    );
    expect(sessions.map((s) => [s.session_id, s.visit_label, s.planned_visit])).toEqual([
      ['ses-V1', 'V1', 'n/a'],
      ['ses-Month6', 'Month 6', 'Month 6'],
    ]);
    // No formula guard in the TSVs: the group's name as typed.
    expect(parseTsv(readFileSync(join(root, 'participants.tsv'), 'utf8'))[0].group).toBe(
      '+Arm B, "open"',
    );

    let measureFiles = 0;
    let compared = 0;
    const labels = new Set<string>();
    for (const file of files) {
      const top = [
        'dataset_description.json',
        'README.md',
        'participants.tsv',
        'participants.json',
        'conditions.tsv',
        'conditions.json',
      ];
      if (top.includes(file)) continue;
      const parts = file.split('/');
      const name = parts[parts.length - 1];
      const { entities, suffix } = expectBidsName(name);
      // The folders repeat the file's own entities (Common principles, "Filesystem structure").
      expect(parts[0]).toBe(`sub-${entities.sub}`);
      labels.add(`sub ${entities.sub.toLowerCase()}`);
      if (suffix === 'sessions') {
        expect(parts).toHaveLength(2);
        continue;
      }
      expect(parts).toEqual([`sub-${entities.sub}`, `ses-${entities.ses}`, 'eeg', name]);
      expect(suffix).toBe('measures');
      expect(Object.keys(entities)).toEqual(['sub', 'ses', 'task', 'desc']);
      if (!name.endsWith('.tsv')) continue;
      measureFiles += 1;
      const content = readFileSync(join(root, file), 'utf8');
      const rows = parseTsv(content);
      // Tabular files: a missing value is "n/a", never an empty cell.
      for (const row of rows) expect(Object.values(row)).not.toContain('');
      const sidecar = JSON.parse(
        readFileSync(join(root, file.replace(/\.tsv$/, '.json')), 'utf8'),
      ) as Record<string, { Description?: string; Units?: string }>;
      for (const column of Object.keys(rows[0])) {
        expect({ column, described: typeof sidecar[column]?.Description }).toEqual({
          column,
          described: 'string',
        });
      }
      for (const column of ['value', 'ci_low', 'ci_high', 'band_low_hz', 'band_high_hz']) {
        expect(sidecar[column].Units).toBe('Hz');
      }
      for (const row of rows) {
        const api = results.get(row.recording_id)!;
        expect(api).toBeDefined();
        expect(entities.task).toBe(api.run.kind === 'resting' ? 'rest' : 'stimulus');
        compared += expectRowMatches(api, row, 'n/a');
      }
    }
    expect(measureFiles).toBe(4);
    expect(compared).toBe((2 + 13 + 13 + 2 + withCycles()) * 11);
    // The conditions table at the root, with the BIDS subject and session of each row.
    const conditions = parseTsv(readFileSync(join(root, 'conditions.tsv'), 'utf8'));
    for (const row of conditions) {
      expect([row.participant_id, row.session_id]).toEqual([
        'sub-A10001',
        row.visit_label === 'V1' ? 'ses-V1' : 'ses-Month6',
      ]);
    }
    expectConditionRows(conditions, 'n/a');
    // Every TSV at any level has its sidecar, and each sidecar describes every column.
    for (const file of files.filter((f) => f.endsWith('.tsv'))) {
      const header = readFileSync(join(root, file), 'utf8').split('\n')[0].split('\t');
      const sidecar = JSON.parse(readFileSync(join(root, file.replace(/\.tsv$/, '.json')), 'utf8'));
      expect(Object.keys(sidecar).sort()).toEqual([...header].sort());
    }
    for (const file of files) {
      expect(readFileSync(join(root, file), 'utf8')).not.toContain(INVENTED_PATIENT_NAME);
    }
    expect(files.some((f) => f.includes('B10001'))).toBe(false);

    // The manifest checksum the header names is that of the files received.
    const manifest = createHash('sha256');
    for (const name of names.filter((n) => !n.endsWith('/'))) {
      const digest = createHash('sha256')
        .update(readFileSync(join(out, name)))
        .digest('hex');
      manifest.update(`${digest}  ${name}\n`);
    }
    expect(response.headers['x-content-manifest-sha256']).toBe(manifest.digest('hex'));
  });

  it('refuses technicians and coordinators (403), other studies (404) and bad ids (400)', async () => {
    for (const user of ['technician', 'coordinator'] as const) {
      for (const path of [
        'results.csv',
        'conditions.csv',
        'export.zip',
        'results-dictionary.csv',
      ]) {
        const response = await request(t.url)
          .get(`/api/studies/${studyA}/${path}`)
          .set(await t.authHeader(user));
        expect([user, path, response.status]).toEqual([user, path, 403]);
      }
    }
    const other = await request(t.url)
      .get(`/api/studies/${t.seed.studies.B.id}/results.csv`)
      .set(await t.authHeader('analyst'));
    expect(other.status).toBe(404);
    const bad = await request(t.url)
      .get('/api/studies/not-a-study/export.zip')
      .set(await t.authHeader('analyst'));
    expect(bad.status).toBe(400);
  });

  it('writes one audit entry per download, naming who, which export, counts and checksum', async () => {
    const before = (await t.dataSource.query(
      `SELECT COUNT(*) AS n FROM "audit_entry" WHERE "action" = 'export' AND "objectType" = 'Study'`,
    )) as Array<{ n: number }>;
    const csv = await download(`/api/studies/${studyA}/results.csv`, 'monitor');
    const zip = await download(`/api/studies/${studyA}/export.zip`, 'analyst');
    const entries = (await t.dataSource.query(
      `SELECT "actorId", "objectId", "studyId", "after" FROM "audit_entry"
       WHERE "action" = 'export' AND "objectType" = 'Study' ORDER BY "seq" DESC LIMIT 2`,
    )) as Array<{ actorId: string; objectId: string; studyId: string; after: string }>;
    const after = (
      (await t.dataSource.query(
        `SELECT COUNT(*) AS n FROM "audit_entry" WHERE "action" = 'export' AND "objectType" = 'Study'`,
      )) as Array<{ n: number }>
    )[0].n;
    expect(after - before[0].n).toBe(2);
    const [zipEntry, csvEntry] = entries;
    const csvRows = parse(csv.body as Buffer, { columns: true }) as Row[];
    expect(csvEntry).toMatchObject({
      actorId: t.seed.users.monitor.id,
      objectId: studyA,
      studyId: studyA,
    });
    expect(JSON.parse(csvEntry.after)).toMatchObject({
      export: 'results.csv',
      rows: csvRows.length,
      sha256: createHash('sha256')
        .update(csv.body as Buffer)
        .digest('hex'),
    });
    expect(zipEntry).toMatchObject({ actorId: t.seed.users.analyst.id, objectId: studyA });
    expect(JSON.parse(zipEntry.after)).toMatchObject({
      export: 'export.zip',
      rows: csvRows.length,
      manifestSha256: zip.headers['x-content-manifest-sha256'],
    });
    expect(JSON.parse(zipEntry.after).files).toBeGreaterThan(8);
  });

  // Last: it adds a settings version of its own.
  it('names the settings each run was computed with, not those the study holds after a change', async () => {
    await changeSettings(
      {
        amplitudeGatePercentile: 10,
        cycleDisagreementHz: 0.35,
        compareConditions: ['Word', 'Tone'],
      },
      'Pilot review: stricter gate, wider cross-check',
    );
    const now = await request(t.url)
      .get(`/api/studies/${studyA}/analysis-settings`)
      .set(await t.authHeader('analyst'));
    expect(now.body).toMatchObject({
      amplitudeGatePercentile: 10,
      cycleDisagreementHz: 0.35,
      compareConditions: ['Word', 'Tone'],
    });

    // results.csv: the gated run keeps 25, 0.1 and Tone − Word; the others the defaults they ran with.
    const csv = await download(`/api/studies/${studyA}/results.csv`, 'analyst');
    expect(csv.status).toBe(200);
    const rows: Row[] = parse(csv.body as Buffer, { columns: true, record_delimiter: '\r\n' });
    expect(rows.length).toBeGreaterThan(0);
    expectDepthColumns(rows, '');
    for (const row of rows.filter((r) => r.recording_kind === 'task')) {
      expect(row.stale_settings).toMatch(/estimate disagreement warning 0\.1 Hz → 0\.35 Hz/);
    }

    // The visit report of A1-0001's first visit: its provenance names the task run's settings.
    const preview = await download(`/api/visits/${t.seed.visits.A1.id}/report/preview`, 'analyst');
    expect(preview.status).toBe(200);
    const text = (await readPdfText(preview.body as Buffer)).text.replace(/\s+/g, ' ');
    expect(text).toContain('Amplitude gate percentile 25 of the envelope');
    expect(text).toContain('Cross-check threshold 0.10 Hz');
    expect(text).toContain('Conditions compared “Tone” − “Word”');
    expect(text).not.toMatch(/0\.35 Hz|percentile 10 of|“Word” − “Tone”/);
  });
});
