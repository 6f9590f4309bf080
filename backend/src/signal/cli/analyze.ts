/**
 * Command-line analysis of one recording, printing JSON on stdout:
 *
 *   npm run analyze -- FILE.edf [--onsets FILE.csv] [--onset-label TEXT]
 *     [--kind task|resting|auto] [--iaf HZ] [--band LO,HI] [--method filter|morlet]
 *     [--roi NAME,NAME,…] [--compare A,B] [--amplitude-gate PERCENTILE|off]
 *     [--cycle-disagreement HZ] [--settings FILE.json] [--full]
 *
 * The settings start as Gyre's defaults (`DEFAULT_ANALYSIS_SETTINGS`), then the fields of
 * `--settings` (a JSON object with `AnalysisSettings` fields, e.g. a study's settings version),
 * then the single flags. `--iaf` is the visit's resting IAF: without a fixed band the band is
 * IAF ± 2 Hz. The run takes the worker's own path (`analyzeEdfRecording`), so `summary` is the
 * `RunSummary` the server stores, to the bit, for the same file, settings and IAF.
 * Without --onset-label every annotation (time-keeping and artefact annotations aside)
 * counts as an onset. Without --kind the kind is inferred: onsets present → task.
 * A task's output lists every condition (onset label) with its Δf, interval, p and trials
 * under `conditions`, and the difference of two of them under `conditionDifference`: the
 * settings' `compareConditions`, else the first two found; `--compare A,B` names them.
 * Beside `phaseBased`, the region's phase-based estimate, it gives `cycleByCycle`, the
 * cycle-by-cycle one (docs/method.md, "Cycle-by-cycle cross-check"). `--amplitude-gate` sets
 * the settings' `amplitudeGatePercentile` (1–90, or off), `--cycle-disagreement` their
 * `cycleDisagreementHz` (above 0, at most 2 Hz), as the server's settings rules allow.
 * A bad file or setting ends with exit code 1, a bad option with 2; the reason on stderr.
 */
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { EdfFormatError } from '../edf/edf-format-error';
import { OnsetCsvError, parseOnsetCsv } from '../onsets/onset-csv';
import {
  AnalysisSettings,
  copyAnalysisSettings,
  DEFAULT_ANALYSIS_SETTINGS,
} from '../pipeline/analysis-settings';
import type { OnsetInput, RecordingKindChoice } from '../pipeline/analysis.types';
import { analyzeEdfRecording, readRecordingForAnalysis } from '../pipeline/analyze-edf-recording';
import { AnalysisInputError } from '../pipeline/analyze-recording';
import type { EdfFileRead } from '../pipeline/read-edf-file';
import { chooseConditionPair, conditionKey } from '../trials/condition-statistics';

class UsageError extends Error {}

/** `--help`: the usage line, then what each option does. */
const HELP = [
  'Analyses one EDF/EDF+/BDF recording with the signal core and prints JSON on stdout.',
  '',
  "  --onsets FILE.csv          onset_s[,label] rows instead of the file's annotations",
  '  --onset-label TEXT         only onsets with this label (case-insensitive)',
  '  --kind task|resting|auto   what the recording is (auto: task when it has onsets)',
  "  --iaf HZ                   the visit's resting IAF; without --band the band is IAF ± 2 Hz",
  '  --band LO,HI               a fixed analysis band, Hz',
  '  --method filter|morlet     band-pass filter or complex Morlet wavelet',
  '  --roi NAME,NAME,…          region of interest as 10-10 names',
  '  --compare A,B              report the difference Δf(A) − Δf(B) of these two onset labels',
  "                             (default: the settings' pair, else the first two labels found)",
  '  --amplitude-gate P|off     leave out instantaneous-frequency samples under percentile P',
  "                             (1–90) of each channel's alpha envelope; off by default",
  '  --cycle-disagreement HZ    warn (cycleByCycle.disagrees) when the cycle-by-cycle and the',
  '                             phase-based Δf differ by more than HZ (0 < HZ ≤ 2; default 0.1)',
  "  --settings FILE.json       analysis settings fields over Gyre's defaults (flags win)",
  '  --full                     also print every series and the whole result',
  '',
  'A task prints conditions (label, Δf, CI, p, trials per onset label), conditionDifference,',
  "phaseBased (the region's Δf) and cycleByCycle, then summary. Exit 1: bad file or",
  'setting; exit 2: bad option.',
].join('\n');

const USAGE =
  'usage: analyze FILE.edf [--onsets FILE.csv] [--onset-label TEXT] [--kind task|resting|auto] ' +
  '[--iaf HZ] [--band LO,HI] [--method filter|morlet] [--roi NAME,NAME,…] ' +
  '[--compare A,B] [--amplitude-gate PERCENTILE|off] [--cycle-disagreement HZ] ' +
  '[--settings FILE.json] [--full]';

export interface CliArguments {
  file: string;
  onsetsFile: string | null;
  settingsFile: string | null;
  kind: RecordingKindChoice;
  iafHz: number | null;
  /** Single flags, applied over the defaults and the settings file. */
  overrides: Partial<AnalysisSettings>;
  /** --compare: the two conditions whose difference is reported (over the settings' pair). */
  compare: [string, string] | null;
  full: boolean;
}

function parseNumberList(flag: string, text: string, count: number): number[] {
  const values = text.split(',').map((v) => Number(v.trim()));
  if (values.length !== count || values.some((v) => !Number.isFinite(v))) {
    throw new UsageError(`${flag}: expected ${count} number(s) separated by commas, got "${text}"`);
  }
  return values;
}

/** The options node:util parseArgs reads; each value is checked below. */
const OPTIONS = {
  onsets: { type: 'string' },
  'onset-label': { type: 'string' },
  kind: { type: 'string' },
  iaf: { type: 'string' },
  band: { type: 'string' },
  method: { type: 'string' },
  roi: { type: 'string' },
  compare: { type: 'string' },
  'amplitude-gate': { type: 'string' },
  'cycle-disagreement': { type: 'string' },
  settings: { type: 'string' },
  full: { type: 'boolean' },
  help: { type: 'boolean' },
} as const;

/** Thrown for --help: the usage goes to stdout and the exit code is 0. */
class HelpRequested extends Error {}

/** parseArgs' own refusals (unknown option, missing value) as a usage error. */
function parsed(
  argv: readonly string[],
): ReturnType<typeof parseArgs<{ options: typeof OPTIONS; allowPositionals: true }>> {
  try {
    return parseArgs({ args: [...argv], options: OPTIONS, allowPositionals: true, strict: true });
  } catch (error) {
    const code = (error as { code?: unknown }).code;
    if (typeof code === 'string' && code.startsWith('ERR_PARSE_ARGS')) {
      throw new UsageError(`${(error as Error).message}\n${USAGE}`);
    }
    throw error;
  }
}

export function parseArguments(argv: readonly string[]): CliArguments {
  const { values, positionals } = parsed(argv);
  if (values.help === true) throw new HelpRequested(USAGE);
  if (positionals.length > 1) {
    throw new UsageError(`one recording expected, got "${positionals[0]}" and "${positionals[1]}"`);
  }
  const file = positionals[0];
  if (file === undefined) throw new UsageError(`no recording given\n${USAGE}`);
  const args: CliArguments = {
    file,
    onsetsFile: values.onsets ?? null,
    settingsFile: values.settings ?? null,
    kind: 'auto',
    iafHz: null,
    overrides: {},
    compare: values.compare !== undefined ? comparedPair(values.compare) : null,
    full: values.full === true,
  };
  if (values['onset-label'] !== undefined) args.overrides.onsetLabel = values['onset-label'];
  if (values.kind !== undefined) {
    const kind = values.kind;
    // The server says 'resting'; 'rest' is the signal core's word for the same.
    if (kind === 'resting' || kind === 'rest') args.kind = 'rest';
    else if (kind === 'task' || kind === 'auto') args.kind = kind;
    else throw new UsageError(`--kind: expected task, resting or auto, got "${kind}"`);
  }
  if (values.band !== undefined) {
    const [lo, hi] = parseNumberList('--band', values.band, 2);
    if (!(lo > 0 && hi > lo)) throw new UsageError(`--band: expected 0 < LO < HI, got ${lo},${hi}`);
    args.overrides.bandHz = [lo, hi];
  }
  if (values.iaf !== undefined) {
    const [iaf] = parseNumberList('--iaf', values.iaf, 1);
    if (!(iaf > 0)) throw new UsageError(`--iaf: expected a positive frequency, got ${iaf}`);
    args.iafHz = iaf;
  }
  if (values.method !== undefined) {
    const method = values.method;
    if (method !== 'filter' && method !== 'morlet') {
      throw new UsageError(`--method: expected filter or morlet, got "${method}"`);
    }
    args.overrides.method = method;
  }
  const gate = values['amplitude-gate'];
  if (gate !== undefined) {
    const percentile =
      gate.trim() === 'off' ? null : parseNumberList('--amplitude-gate', gate, 1)[0];
    if (percentile !== null && !(percentile >= 1 && percentile <= 90)) {
      throw new UsageError(
        `--amplitude-gate: expected a percentile from 1 to 90 or off, got ${gate}`,
      );
    }
    args.overrides.amplitudeGatePercentile = percentile;
  }
  const disagreement = values['cycle-disagreement'];
  if (disagreement !== undefined) {
    const [hz] = parseNumberList('--cycle-disagreement', disagreement, 1);
    if (!(hz > 0 && hz <= 2)) {
      throw new UsageError(`--cycle-disagreement: expected 0 < HZ ≤ 2, got ${disagreement}`);
    }
    args.overrides.cycleDisagreementHz = hz;
  }
  if (values.roi !== undefined) {
    const names = values.roi
      .split(',')
      .map((n) => n.trim())
      .filter((n) => n !== '');
    if (names.length === 0) throw new UsageError('--roi: expected at least one channel name');
    args.overrides.roi = names;
  }
  return args;
}

/** `--compare A,B`: two different, non-empty onset labels. */
function comparedPair(text: string): [string, string] {
  const names = text.split(',').map((n) => n.trim());
  if (
    names.length !== 2 ||
    names.some((n) => n === '') ||
    conditionKey(names[0]) === conditionKey(names[1])
  ) {
    throw new UsageError(`--compare: expected two different onset labels as A,B, got "${text}"`);
  }
  return [names[0], names[1]];
}

/** `--compare` names a condition no onset has: the labels found, for the message. */
function checkComparedConditions(compare: [string, string] | null, found: readonly string[]): void {
  if (compare === null) return;
  const choice = chooseConditionPair(found, null, compare);
  if (choice.pair !== null) return;
  const listed = found.length > 0 ? found.map((f) => `"${f}"`).join(', ') : 'none';
  throw new UsageError(
    `--compare: no onsets labelled ${choice.unknown.map((u) => `"${u}"`).join(' or ')}; ` +
      `conditions found: ${listed}`,
  );
}

function readText(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (error) {
    throw new UsageError(`${path}: cannot read the file (${(error as Error).message})`);
  }
}

/** The fields of a settings file over Gyre's defaults; unknown fields are refused. */
function settingsFromFile(path: string): Partial<AnalysisSettings> {
  let parsed: unknown;
  try {
    parsed = JSON.parse(readText(path));
  } catch (error) {
    if (error instanceof UsageError) throw error;
    throw new UsageError(`${path}: not JSON (${(error as Error).message})`);
  }
  if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed)) {
    throw new UsageError(`${path}: expected a JSON object of analysis settings`);
  }
  const known = Object.keys(DEFAULT_ANALYSIS_SETTINGS);
  const unknown = Object.keys(parsed).filter((key) => !known.includes(key));
  if (unknown.length > 0) {
    throw new UsageError(
      `${path}: unknown setting(s) ${unknown.join(', ')}; known: ${known.join(', ')}`,
    );
  }
  return parsed as Partial<AnalysisSettings>;
}

/** The effective settings: defaults, then the settings file, then the single flags. */
export function effectiveSettings(args: CliArguments): AnalysisSettings {
  const fromFile = args.settingsFile !== null ? settingsFromFile(args.settingsFile) : {};
  return copyAnalysisSettings({ ...DEFAULT_ANALYSIS_SETTINGS, ...fromFile, ...args.overrides });
}

/** Typed arrays become plain arrays; NaN and infinities become null (JSON has neither). */
function toJson(value: unknown): string {
  return JSON.stringify(
    value,
    (_key, v: unknown) =>
      ArrayBuffer.isView(v) && !(v instanceof DataView) ? Array.from(v as Float64Array) : v,
    2,
  );
}

export async function main(argv: readonly string[]): Promise<number> {
  try {
    const args = parseArguments(argv);
    const settings = effectiveSettings(args);
    let read: EdfFileRead;
    try {
      read = await readRecordingForAnalysis(args.file);
    } catch (error) {
      throw new UsageError(`${args.file}: cannot read the file (${(error as Error).message})`);
    }
    const recording = read.finish();
    let onsets: OnsetInput[] | null = null;
    if (args.onsetsFile !== null) {
      const parsed = parseOnsetCsv(readText(args.onsetsFile), {
        recordingDurationS: recording.durationS,
      });
      onsets = parsed.map((o) => ({ onsetS: o.onsetS, label: o.label }));
    }
    const { result, outcome } = analyzeEdfRecording(recording, {
      kind: args.kind,
      settings,
      iafHz: args.iafHz,
      onsets,
      compareConditions: args.compare,
    });
    const task = outcome.summary.task;
    checkComparedConditions(args.compare, task?.conditions.map((c) => c.label) ?? []);
    const report = {
      file: args.file,
      kind: result.kind,
      iafHz: result.iafHz,
      settings: result.settings,
      computation: result.computation,
      ...(task !== null
        ? {
            conditions: task.conditions.map((c) => ({
              label: c.label,
              deltaFHz: c.deltaFHz,
              ciHz: c.ciHz,
              pValue: c.pValue,
              trialsKept: c.trialsKept,
              trialsTotal: c.trialsTotal,
            })),
            conditionDifference: task.conditionDifference,
            // The region's phase-based estimate (baseline, post, Δf, CI, p, trials).
            phaseBased: outcome.summary.roi,
            cycleByCycle: task.cycles,
          }
        : {}),
      summary: outcome.summary,
      ...(args.full ? { series: outcome.series, result } : {}),
    };
    process.stdout.write(toJson(report) + '\n');
    return 0;
  } catch (error) {
    if (error instanceof HelpRequested) {
      process.stdout.write(`${USAGE}\n\n${HELP}\n`);
      return 0;
    }
    if (
      error instanceof UsageError ||
      error instanceof EdfFormatError ||
      error instanceof OnsetCsvError ||
      error instanceof AnalysisInputError
    ) {
      process.stderr.write(`analyze: ${error.message}\n`);
      return error instanceof UsageError ? 2 : 1;
    }
    throw error;
  }
}

if (require.main === module) {
  void main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
