/**
 * An analysis result on the wire from a worker to the server: JSON with the summary as it is
 * and each series as base64 of its IEEE 754 binary64 values, little-endian (8 bytes a value,
 * exact: no decimal round trip, NaN kept). The server checks the shape (dto/) and the sizes
 * against the summary before anything is stored, and names the first few problems.
 */
import { plainToInstance } from 'class-transformer';
import { validateSync, ValidationError } from 'class-validator';
import type { AnalyzeOutcome, ResultSeries, RunSummary } from '../signal/pipeline/run-summary';
import { RunSummaryDto } from './dto/run-summary.dto';

/** The request's content type: not `application/json`, so the API's small JSON limit skips it. */
export const RESULT_CONTENT_TYPE = 'application/vnd.gyre.analysis-result+json';

export interface ResultBody {
  /** The worker's Gyre version (it must be the server's). */
  gyreVersion: string;
  summary: RunSummary;
  /** Series name → base64 of little-endian float64 values. */
  series: Record<string, string>;
}

const MAX_SERIES = 20_000;
const MAX_SERIES_NAME = 300;
const BASE64 = /^[A-Za-z0-9+/]*={0,2}$/;

export function encodeResultBody(outcome: AnalyzeOutcome, gyreVersion: string): ResultBody {
  const series: Record<string, string> = {};
  for (const [name, values] of Object.entries(outcome.series)) {
    series[name] = float64ToBase64(values);
  }
  return { gyreVersion, summary: outcome.summary, series };
}

export function float64ToBase64(values: Float64Array): string {
  const bytes = Buffer.alloc(values.length * 8);
  for (let i = 0; i < values.length; i++) bytes.writeDoubleLE(values[i], i * 8);
  return bytes.toString('base64');
}

/** The values, or a problem in words. */
export function base64ToFloat64(text: string): Float64Array | string {
  if (text.length % 4 !== 0 || !BASE64.test(text)) return 'is not base64';
  const bytes = Buffer.from(text, 'base64');
  if (bytes.length % 8 !== 0) {
    return `holds ${bytes.length} bytes, not a whole number of 8-byte values`;
  }
  const values = new Float64Array(bytes.length / 8);
  for (let i = 0; i < values.length; i++) values[i] = bytes.readDoubleLE(i * 8);
  return values;
}

export type ParsedResult =
  { ok: true; gyreVersion: string; outcome: AnalyzeOutcome } | { ok: false; problems: string[] };

/** Checks a posted body completely; the outcome is built from the body's own plain values. */
export function parseResultBody(body: unknown): ParsedResult {
  if (typeof body !== 'object' || body === null || Array.isArray(body)) {
    return { ok: false, problems: ['the body must be a JSON object'] };
  }
  const raw = body as Record<string, unknown>;
  const problems: string[] = [];
  for (const key of Object.keys(raw)) {
    if (!['gyreVersion', 'summary', 'series'].includes(key)) problems.push(`${key}: unknown field`);
  }
  if (typeof raw.gyreVersion !== 'string' || raw.gyreVersion.length === 0) {
    problems.push('gyreVersion: must be the worker’s Gyre version');
  }
  if (typeof raw.summary !== 'object' || raw.summary === null || Array.isArray(raw.summary)) {
    problems.push('summary: must be an object');
  } else {
    const dto = plainToInstance(RunSummaryDto, raw.summary);
    const errors = validateSync(dto, { whitelist: true, forbidNonWhitelisted: true });
    problems.push(...flatten(errors, 'summary'));
  }
  const series = parseSeries(raw.series, problems);
  if (problems.length > 0 || series === null) return { ok: false, problems: problems.slice(0, 20) };
  const summary = raw.summary as RunSummary;
  problems.push(...sizeProblems(summary, series));
  if (problems.length > 0) return { ok: false, problems: problems.slice(0, 20) };
  return { ok: true, gyreVersion: raw.gyreVersion as string, outcome: { summary, series } };
}

function parseSeries(value: unknown, problems: string[]): ResultSeries | null {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    problems.push('series: must be an object of base64 strings');
    return null;
  }
  const entries = Object.entries(value);
  if (entries.length > MAX_SERIES) {
    problems.push(`series: ${entries.length} series, at most ${MAX_SERIES}`);
    return null;
  }
  const series: ResultSeries = {};
  for (const [name, text] of entries) {
    if (name.length === 0 || name.length > MAX_SERIES_NAME) {
      problems.push(`series: a name of ${name.length} characters (1 to ${MAX_SERIES_NAME})`);
      continue;
    }
    if (typeof text !== 'string') {
      problems.push(`series.${name}: must be a base64 string`);
      continue;
    }
    const values = base64ToFloat64(text);
    if (typeof values === 'string') problems.push(`series.${name}: ${values}`);
    else series[name] = values;
  }
  return series;
}

/** The series the summary says exist, with the lengths it implies (run-summary.ts). */
function sizeProblems(summary: RunSummary, series: ResultSeries): string[] {
  const problems: string[] = [];
  const length = (name: string): number | null => series[name]?.length ?? null;
  const expect = (name: string, wanted: number | null, why: string): void => {
    const found = length(name);
    if (found === null) problems.push(`series.${name}: missing (${why})`);
    else if (wanted !== null && found !== wanted) {
      problems.push(`series.${name}: ${found} values, ${wanted} expected (${why})`);
    }
  };
  if (summary.task !== null) {
    const points = length('timeS');
    expect('timeS', null, 'a task result has a curve');
    for (const part of ['mean', 'ciLow', 'ciHigh']) {
      expect(`roi:${part}`, points, 'one value per curve point');
      for (const channel of summary.task.curveChannels) {
        expect(`channel:${channel}:${part}`, points, 'named in summary.task.curveChannels');
      }
      for (const condition of summary.task.conditionCurves) {
        expect(`condition:${condition}:${part}`, points, 'named in summary.task.conditionCurves');
      }
    }
    const { rasterTrials, rasterPoints } = summary.task;
    expect('raster', rasterTrials * rasterPoints, 'summary.task.rasterTrials × rasterPoints');
    expect('raster:timeS', rasterPoints, 'summary.task.rasterPoints');
    expect('trialDeltaFHz', null, 'a task result has per-trial Δf');
  }
  if (summary.rest !== null) {
    expect('rest:frequencyHz', null, 'a resting result has a spectrum');
    expect('rest:powerUv2PerHz', length('rest:frequencyHz'), 'one power per frequency');
  }
  return problems;
}

function flatten(errors: ValidationError[], path: string): string[] {
  const out: string[] = [];
  for (const error of errors) {
    const here = `${path}.${error.property}`;
    for (const message of Object.values(error.constraints ?? {})) {
      // class-validator names the property alone; the path says where it is.
      out.push(`${here}: ${message.replace(new RegExp(`^${escape(error.property)} `), '')}`);
    }
    out.push(...flatten(error.children ?? [], here));
  }
  return out;
}

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
