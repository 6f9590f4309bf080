/**
 * The results routes over HTTP on the real app: compressed answers (gzip RFC 1952, brotli
 * RFC 7932, decoded here by Node's zlib), the size of a 64-channel task result, series rounded
 * as RESULT_SERIES_DECIMALS says against the stored full-precision run, the trial raster and
 * a channel's curve on their own routes, cached bodies that stay identical, access checked on
 * every request, and no-store on study data. Recordings are generated (load-recordings.ts,
 * recordings-fixtures.ts).
 */
import { randomUUID } from 'node:crypto';
import { request as httpRequest, type IncomingHttpHeaders } from 'node:http';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import request from 'supertest';
import {
  RESULT_SERIES_DECIMALS,
  SPECTRUM_POWER_SIGNIFICANT_DIGITS,
  type OnsetCurveView,
  type RecordingView,
  type RecordingResultsView,
  type TrialRasterView,
} from '@gyre/shared';
import { AnalysisRun } from '../src/analysis/analysis-run.entity';
import { toResultsView } from '../src/analysis/analysis-runs.service';
import { decodeResultSeries } from '../src/analysis/result-series-codec';
import { ResultsBodyCache } from '../src/analysis/results-body-cache';
import { Recording } from '../src/recordings/recording.entity';
import { LABELS_64, task64Edf } from '../src/robustness/cli/load-recordings';
import type { UserKey } from './helpers/seed';
import { currentSettings } from './helpers/analysis-settings';
import { acceptedUpload } from './helpers/accepted-upload';
import { useTestApp } from './helpers/test-app';
import { syntheticRestEdf, waitForState } from './recordings-fixtures';

interface RawAnswer {
  status: number;
  headers: IncomingHttpHeaders;
  /** The body's bytes as they crossed the wire (still encoded). */
  body: Buffer;
}

/** One GET without any client-side decoding, so the wire bytes can be counted. */
function rawGet(url: string, path: string, headers: Record<string, string>): Promise<RawAnswer> {
  return new Promise((done, fail) => {
    const req = httpRequest(`${url}${path}`, { headers }, (response) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () =>
        done({
          status: response.statusCode ?? 0,
          headers: response.headers,
          body: Buffer.concat(chunks),
        }),
      );
    });
    req.on('error', fail);
    req.end();
  });
}

/** The JSON a raw answer carries, decoded with zlib as its Content-Encoding says. */
function jsonOf<T>(answer: RawAnswer): T {
  const encoding = answer.headers['content-encoding'];
  const bytes =
    encoding === 'gzip'
      ? gunzipSync(answer.body)
      : encoding === 'br'
        ? brotliDecompressSync(answer.body)
        : answer.body;
  return JSON.parse(bytes.toString('utf8')) as T;
}

/** Digits after the point as ECMAScript's Number::toString (and so JSON) writes the value. */
function decimalsOf(value: number): number {
  const text = String(value);
  if (text.includes('e')) {
    const [mantissa, exponent] = text.split('e');
    return Math.max(0, (mantissa.split('.')[1]?.length ?? 0) - Number(exponent));
  }
  return text.split('.')[1]?.length ?? 0;
}

/**
 * The documented rule, checked value by value: null exactly where the stored value is not a
 * number, at most `decimals` digits after the point, within half a unit of the last place.
 */
function expectRounded(
  sent: ReadonlyArray<number | null>,
  stored: ArrayLike<number>,
  decimals: number,
): void {
  expect(sent).toHaveLength(stored.length);
  const half = 0.5 * 10 ** -decimals;
  const wrong: string[] = [];
  for (let i = 0; i < stored.length; i++) {
    const value = sent[i];
    const truth = stored[i];
    if (!Number.isFinite(truth)) {
      if (value !== null) wrong.push(`[${i}] ${value} for ${truth}`);
    } else if (
      value === null ||
      decimalsOf(value) > decimals ||
      Math.abs(value - truth) > half + 1e-12
    ) {
      wrong.push(`[${i}] ${value} for ${truth}`);
    }
  }
  expect(wrong.slice(0, 5)).toEqual([]);
}

const BROWSER = 'gzip, deflate, br';

describe('results over HTTP', () => {
  const t = useTestApp();
  let task: RecordingView;
  let rest: RecordingView;
  let auth: (user: UserKey) => Promise<Record<string, string>>;

  beforeAll(async () => {
    auth = (user) => t.authHeader(user);
    const visitId = t.seed.visits.A1.id;
    // Rest first and computed, so the task is computed once, in the band around its IAF.
    const restUp = await acceptedUpload(
      t,
      { kind: 'resting', bytes: syntheticRestEdf({ durationS: 60, peakHz: 10, seed: 71 }) },
      visitId,
    );
    rest = await waitForState(t, 'technician', restUp.id, ['ready']);
    const taskUp = await acceptedUpload(
      t,
      {
        kind: 'task',
        bytes: task64Edf({ durationS: 60, seed: 72, baseFrequencyHz: 10, dipHz: -0.5 }),
      },
      visitId,
    );
    task = await waitForState(t, 'technician', taskUp.id, ['ready']);
    await t.computationsIdle();
    task = await waitForState(t, 'technician', task.id, ['ready']);
  }, 180_000);

  async function storedSeries(runId: string | null): Promise<Record<string, Float64Array>> {
    const run = await t.dataSource.getRepository(AnalysisRun).findOneByOrFail({ id: runId ?? '' });
    return decodeResultSeries(run.series);
  }

  async function get(path: string, user: UserKey, encoding: string): Promise<RawAnswer> {
    return rawGet(t.url, path, { ...(await auth(user)), 'Accept-Encoding': encoding });
  }

  it('sends a 64-channel task result gzip-encoded when asked, under 80 KB on the wire, the same JSON as uncompressed', async () => {
    const path = `/api/recordings/${task.id}/results`;
    const gzip = await get(path, 'analyst', 'gzip');
    expect(gzip.status).toBe(200);
    expect(gzip.headers['content-encoding']).toBe('gzip');
    expect(gzip.headers.vary).toMatch(/Accept-Encoding/i);
    expect(Number(gzip.headers['content-length'])).toBe(gzip.body.length);
    expect(gzip.body.length).toBeLessThan(80_000);
    const plain = await get(path, 'analyst', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers['content-type']).toBe('application/json; charset=utf-8');
    const results = jsonOf<RecordingResultsView>(plain);
    expect(jsonOf<RecordingResultsView>(gzip)).toEqual(results);
    // What a browser asks for: brotli, smaller still, the same JSON.
    const browser = await get(path, 'analyst', BROWSER);
    expect(browser.headers['content-encoding']).toBe('br');
    expect(browser.body.length).toBeLessThanOrEqual(gzip.body.length);
    expect(jsonOf<RecordingResultsView>(browser)).toEqual(results);
    // All 64 channels are in the table and each has a curve of its own to ask for.
    expect(results.channels).toHaveLength(64);
    expect(results.task?.curveChannels).toEqual(LABELS_64);
    expect(results.run.trialsKept).toBeGreaterThan(0);
  });

  it('rounds the series as RESULT_SERIES_DECIMALS says and keeps the stored run at full precision for the report', async () => {
    const results = jsonOf<RecordingResultsView>(
      await get(`/api/recordings/${task.id}/results`, 'analyst', 'gzip'),
    );
    const stored = await storedSeries(task.latestRunId);
    const d = RESULT_SERIES_DECIMALS;
    expectRounded(results.task?.timeS ?? [], stored.timeS, d.timeS);
    expectRounded(results.task?.roi.meanHz ?? [], stored['roi:mean'], d.curveHz);
    expectRounded(results.task?.roi.ciLowHz ?? [], stored['roi:ciLow'], d.curveHz);
    expectRounded(results.task?.roi.ciHighHz ?? [], stored['roi:ciHigh'], d.curveHz);
    // The store itself was not rounded: finer digits than the answer's are still there.
    expect(Array.from(stored['roi:mean']).some((v) => decimalsOf(v) > d.curveHz)).toBe(true);

    // The visit report's path reads the stored curve exactly (no rounding on the way).
    const run = await t.dataSource
      .getRepository(AnalysisRun)
      .findOneByOrFail({ id: task.latestRunId ?? '' });
    const recording = await t.dataSource.getRepository(Recording).findOneByOrFail({ id: task.id });
    const forReport = toResultsView(run, recording, []);
    expect(forReport.task?.roi.meanHz).toEqual(
      Array.from(stored['roi:mean'], (v) => (Number.isFinite(v) ? v : null)),
    );
    expect(forReport.task?.timeS).toEqual(Array.from(stored.timeS));
    // Headline numbers and the per-channel table are never rounded.
    expect(results.run.roiDeltaFHz).toBe(run.roiDeltaFHz);
    expect(results.channels).toEqual(forReport.channels);
  });

  it('rounds the rest spectrum: frequencies to 4 decimals, power to 4 significant digits', async () => {
    const results = jsonOf<RecordingResultsView>(
      await get(`/api/recordings/${rest.id}/results`, 'analyst', 'gzip'),
    );
    const stored = await storedSeries(rest.latestRunId);
    const spectrum = results.rest;
    expect(spectrum).not.toBeNull();
    expectRounded(
      spectrum?.frequencyHz ?? [],
      stored['rest:frequencyHz'],
      RESULT_SERIES_DECIMALS.spectrumFrequencyHz,
    );
    const power = stored['rest:powerUv2PerHz'];
    expect(spectrum?.powerUv2PerHz).toHaveLength(power.length);
    const digits = SPECTRUM_POWER_SIGNIFICANT_DIGITS;
    spectrum?.powerUv2PerHz.forEach((value, i) => {
      // ECMAScript Number.prototype.toPrecision: the value written with `digits` significant digits.
      expect(value).toBe(Number(power[i].toPrecision(digits)));
      expect(Math.abs(value - power[i])).toBeLessThanOrEqual(0.5 * 10 ** (1 - digits) * power[i]);
    });
    // Generated truth: the resting alpha peak is at 10 Hz (within one 0.25 Hz Welch bin).
    expect(Math.abs((results.run.pafHz ?? 0) - 10)).toBeLessThanOrEqual(0.25);
  });

  it('gives the raster chart its trials × time on a route of its own, rounded to 0.01 Hz', async () => {
    const answer = await get(`/api/recordings/${task.id}/results/raster`, 'analyst', 'gzip');
    expect(answer.status).toBe(200);
    expect(answer.headers['content-encoding']).toBe('gzip');
    const raster = jsonOf<TrialRasterView>(answer);
    const stored = await storedSeries(task.latestRunId);
    expect(raster.trialOnsetsS).toHaveLength(raster.trials);
    expect(raster.points).toBe(raster.timeS.length);
    expect(raster.points).toBeLessThanOrEqual(500);
    expect(raster.valuesHz).toHaveLength(raster.trials * raster.points);
    expect(raster.trialDeltaFHz).toHaveLength(raster.trials);
    expectRounded(raster.valuesHz, stored.raster, RESULT_SERIES_DECIMALS.rasterHz);
    expectRounded(raster.timeS, stored['raster:timeS'], RESULT_SERIES_DECIMALS.timeS);
    expectRounded(raster.trialDeltaFHz, stored.trialDeltaFHz, RESULT_SERIES_DECIMALS.trialDeltaFHz);
    const results = jsonOf<RecordingResultsView>(
      await get(`/api/recordings/${task.id}/results`, 'analyst', 'gzip'),
    );
    expect(results.task?.raster).toEqual({ trials: raster.trials, points: raster.points });
    expect(raster.trials).toBe(results.run.trialsKept);
    // Generated truth (syntheticTaskFrequencyHz): 10 Hz before onset, 9.5 Hz from +0.2 to +0.8 s.
    const meanIn = ([from, to]: [number, number]): number => {
      const cells: number[] = [];
      for (let trial = 0; trial < raster.trials; trial++) {
        raster.timeS.forEach((s, point) => {
          const v = raster.valuesHz[trial * raster.points + point];
          if (s >= from && s <= to && v !== null) cells.push(v);
        });
      }
      return cells.reduce((sum, v) => sum + v, 0) / cells.length;
    };
    expect(Math.abs(meanIn([-0.5, 0]) - 10)).toBeLessThan(0.1);
    expect(Math.abs(meanIn([0.3, 0.7]) - 9.5)).toBeLessThan(0.1);
  });

  it("gives one channel's onset curve when asked, and names a channel the run has no curve for", async () => {
    const channel = 'EEG O1-REF';
    const path = `/api/recordings/${task.id}/results/curves?channel=${encodeURIComponent(channel)}`;
    const answer = await get(path, 'analyst', 'gzip');
    expect(answer.status).toBe(200);
    const curve = jsonOf<OnsetCurveView>(answer);
    const stored = await storedSeries(task.latestRunId);
    expect(curve.name).toBe(channel);
    expectRounded(curve.meanHz, stored[`channel:${channel}:mean`], RESULT_SERIES_DECIMALS.curveHz);
    expectRounded(
      curve.ciLowHz,
      stored[`channel:${channel}:ciLow`],
      RESULT_SERIES_DECIMALS.curveHz,
    );

    const unknown = await request(t.url)
      .get(`/api/recordings/${task.id}/results/curves`)
      .query({ channel: 'EEG X9-REF' })
      .set(await auth('analyst'));
    expect(unknown.status).toBe(404);
    expect(unknown.body.code).toBe('ANALYSIS_CHANNEL_CURVE_NOT_FOUND');
    expect(unknown.body.message).toContain('"EEG X9-REF"');
    const missing = await request(t.url)
      .get(`/api/recordings/${task.id}/results/curves`)
      .set(await auth('analyst'));
    expect(missing.status).toBe(400);
    expect(JSON.stringify(missing.body)).toContain('channel');
    const restRaster = await request(t.url)
      .get(`/api/recordings/${rest.id}/results/raster`)
      .set(await auth('analyst'));
    expect(restRaster.status).toBe(404);
    expect(restRaster.body.code).toBe('ANALYSIS_NO_TASK_RESULTS');
  });

  it('answers a repeated read from the cache with the identical bytes', async () => {
    const cache = t.app.get(ResultsBodyCache);
    for (const path of [
      `/api/recordings/${task.id}/results`,
      `/api/recordings/${task.id}/results/raster`,
    ]) {
      const first = await get(path, 'analyst', 'gzip');
      const before = cache.stats();
      const again = await get(path, 'monitor', 'gzip');
      const after = cache.stats();
      expect(after.hits).toBe(before.hits + 1);
      expect(after.misses).toBe(before.misses);
      expect(again.body.equals(first.body)).toBe(true);
    }
    // Many readers at once on a body not built yet: one build, every answer the same.
    const path = `/api/recordings/${task.id}/results/curves?channel=${encodeURIComponent('EEG Pz-REF')}`;
    const before = cache.stats();
    const answers = await Promise.all(
      Array.from({ length: 8 }, () => get(path, 'analyst', 'gzip')),
    );
    expect(cache.stats().misses).toBe(before.misses + 1);
    expect(answers.every((a) => a.status === 200 && a.body.equals(answers[0].body))).toBe(true);
  });

  it('checks access on every request, even when the body is cached', async () => {
    const path = `/api/recordings/${task.id}/results`;
    const cached = await get(path, 'analyst', 'gzip');
    expect(cached.status).toBe(200);
    for (const suffix of ['', '/raster', `/curves?channel=${encodeURIComponent('EEG O1-REF')}`]) {
      const route = `${path}${suffix}`;
      await get(route, 'analyst', 'gzip');
      // Another study's analyst: the recording is not theirs to know of (404); a technician may
      // never read results (403); nobody signed in (401). None of them gets a byte of the body.
      const other = await get(route, 'analystB', 'gzip');
      expect(other.status).toBe(404);
      expect(jsonOf<{ code: string }>(other).code).toBe('RECORDING_NOT_FOUND');
      const technician = await get(route, 'technician', 'gzip');
      expect(technician.status).toBe(403);
      const anonymous = await rawGet(t.url, route, { 'Accept-Encoding': 'gzip' });
      expect(anonymous.status).toBe(401);
      for (const refused of [other, technician, anonymous]) {
        expect(JSON.stringify(jsonOf(refused))).not.toContain(task.latestRunId ?? '');
      }
    }
    // A run of another recording is not found through this one, though its body is cached.
    const crossed = await request(t.url)
      .get(`/api/recordings/${rest.id}/results`)
      .query({ runId: task.latestRunId })
      .set(await auth('analyst'));
    expect(crossed.status).toBe(404);
    expect(crossed.body.code).toBe('ANALYSIS_RUN_NOT_FOUND');
  });

  it('keeps Cache-Control: no-store on study data, compressed or not', async () => {
    const participant = t.seed.participants.A1.id;
    for (const path of [
      `/api/recordings/${task.id}/results`,
      `/api/recordings/${task.id}/results/raster`,
      `/api/recordings/${task.id}/results/curves?channel=${encodeURIComponent('EEG O1-REF')}`,
      '/api/participants',
      `/api/participants/${participant}/trajectory`,
    ]) {
      for (const encoding of ['identity', 'gzip', BROWSER]) {
        const answer = await get(path, 'analyst', encoding);
        expect([path, encoding, answer.status]).toEqual([path, encoding, 200]);
        expect(answer.headers['cache-control']).toBe('no-store');
        // Nothing may keep the answer, so nothing revalidates it: no ETag is computed.
        expect(answer.headers.etag).toBeUndefined();
      }
    }
  });

  it('compresses the other JSON answers with the middleware, and never an event stream', async () => {
    const docs = await rawGet(t.url, '/api/docs/openapi.json', { 'Accept-Encoding': 'gzip' });
    expect(docs.headers['content-encoding']).toBe('gzip');
    expect(jsonOf<{ paths: object }>(docs).paths).toBeDefined();
    const events = await new Promise<IncomingHttpHeaders>((done, fail) => {
      void auth('analyst').then((headers) => {
        const req = httpRequest(
          `${t.url}/api/recordings/${task.id}/events`,
          { headers: { ...headers, 'Accept-Encoding': BROWSER } },
          (response) => {
            done(response.headers);
            req.destroy();
          },
        );
        req.on('error', (error: NodeJS.ErrnoException) => {
          if (error.code !== 'ECONNRESET') fail(error);
        });
        req.end();
      });
    });
    expect(events['content-type']).toMatch(/^text\/event-stream/);
    expect(events['content-encoding']).toBeUndefined();
  });

  it('says on the cached results when the study settings have changed since the run', async () => {
    const path = `/api/recordings/${task.id}/results`;
    const before = jsonOf<RecordingResultsView>(await get(path, 'analyst', 'gzip'));
    expect(before.run.staleSettings).toEqual([]);
    const studyId = t.seed.studies.A.id;
    const { values } = await currentSettings(t, studyId);
    const saved = await request(t.url)
      .post(`/api/studies/${studyId}/analysis-settings`)
      .set(await auth('analyst'))
      .send({ ...values, postWindowS: [0.3, 0.9], reason: 'A longer post window for the pilot' });
    expect(saved.status).toBe(201);
    const after = jsonOf<RecordingResultsView>(await get(path, 'analyst', 'gzip'));
    expect(after.run.id).toBe(before.run.id);
    expect(after.run.staleSettings.join(' ')).toContain('post window');
    // Everything else is the same run's numbers.
    expect({ ...after, run: { ...after.run, staleSettings: [] } }).toEqual(before);
  });

  it('shows a settings version or visit override written by any writer at the very next request, however warm the caches', async () => {
    const path = `/api/recordings/${task.id}/results`;
    const notice = async (): Promise<string[]> => {
      // Several reads, so that every cache on the way has the answer before the change.
      const answers = await Promise.all(
        ['analyst', 'monitor', 'analyst'].map((user) => get(path, user as UserKey, 'br')),
      );
      const notices = answers.map((a) => jsonOf<RecordingResultsView>(a).run.staleSettings);
      expect(notices[1]).toEqual(notices[0]);
      expect(notices[2]).toEqual(notices[0]);
      return notices[0];
    };
    const run = await t.dataSource.getRepository(AnalysisRun).findOneByOrFail({
      id: task.latestRunId ?? '',
    });
    const used = JSON.parse(run.settingsJson) as Record<string, unknown>;
    // Rows written straight into the tables, as another process or a migration would: no
    // service call, no event. Versions and overrides are only ever added.
    let version = (
      (await t.dataSource.query(
        `SELECT max("version") AS "v" FROM "analysis_settings" WHERE "studyId" = ?`,
        [run.studyId],
      )) as { v: number }[]
    )[0].v;
    const addVersion = async (values: Record<string, unknown>): Promise<void> => {
      version += 1;
      await t.dataSource.query(
        `INSERT INTO "analysis_settings" ("id", "studyId", "version", "valuesJson", "reason", "createdById", "createdAt")
         VALUES (?, ?, ?, ?, 'written straight into the table', NULL, ?)`,
        [randomUUID(), run.studyId, version, JSON.stringify(values), new Date().toISOString()],
      );
    };
    const threshold = `rejection threshold ${String(used.rejectionThresholdUv)} µV → 150 µV`;
    await notice();
    // Another rejection threshold: the very next answer names it.
    await addVersion({ ...used, rejectionThresholdUv: 150 });
    expect(await notice()).toEqual([threshold]);
    // The run's own settings again: nothing is stale, at once.
    await addVersion(used);
    expect(await notice()).toEqual([]);
    // A visit override (its own region of interest) over that version: the next answer names it.
    await t.dataSource.query(
      `INSERT INTO "visit_analysis_override" ("id", "visitId", "studyId", "siteId", "revision", "valuesJson", "reason", "createdById", "createdAt")
       VALUES (?, ?, ?, ?, 1, ?, 'written straight into the table', ?, ?)`,
      [
        randomUUID(),
        run.visitId,
        run.studyId,
        run.siteId,
        JSON.stringify({ roi: ['O1', 'O2'], bandHz: null, onsetLabel: null }),
        t.seed.users.analyst.id,
        new Date().toISOString(),
      ],
    );
    const overridden = await notice();
    expect(overridden).toHaveLength(1);
    expect(overridden[0]).toMatch(/^region of interest .* → O1, O2$/);
    // The runs list reads the same notice.
    const runs = await request(t.url)
      .get(`/api/recordings/${task.id}/runs`)
      .set(await auth('analyst'));
    const listed = (runs.body as { items: { id: string; staleSettings: string[] }[] }).items.find(
      (r) => r.id === run.id,
    );
    expect(listed?.staleSettings).toEqual(overridden);
  });
});
