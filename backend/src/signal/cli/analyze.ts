/**
 * Command-line analysis of one recording, printing JSON on stdout:
 *
 *   npm run analyze -- FILE.edf [--onsets FILE.csv] [--onset-label TEXT]
 *                      [--kind task|rest] [--band LO,HI] [--iaf HZ] [--method plateau|morlet] [--full]
 *
 * Without --onset-label every annotation (time-keeping and artefact annotations aside)
 * counts as an onset. Without --kind the kind is inferred: onsets present → task.
 * A bad file or option ends with exit code 1 and the reason on stderr.
 */
import { readFileSync } from 'node:fs';
import { EdfFormatError } from '../edf/edf-format-error';
import { readEdf } from '../edf/edf-reader';
import { OnsetCsvError, parseOnsetCsv } from '../onsets/onset-csv';
import { analyzeRecording, AnalysisInputError } from '../pipeline/analyze-recording';
import { AnalysisOptions, AnalysisResult, OnsetResult } from '../pipeline/analysis.types';

class UsageError extends Error {}

const USAGE =
  'usage: analyze FILE.edf [--onsets FILE.csv] [--onset-label TEXT] [--kind task|rest] ' +
  '[--band LO,HI] [--iaf HZ] [--method plateau|morlet] [--full]';

interface CliArguments {
  file: string;
  onsetsFile: string | null;
  options: AnalysisOptions;
  full: boolean;
}

function parseNumberList(flag: string, text: string, count: number): number[] {
  const values = text.split(',').map((v) => Number(v.trim()));
  if (values.length !== count || values.some((v) => !Number.isFinite(v))) {
    throw new UsageError(`${flag}: expected ${count} number(s) separated by commas, got "${text}"`);
  }
  return values;
}

export function parseArguments(argv: readonly string[]): CliArguments {
  let file: string | null = null;
  let onsetsFile: string | null = null;
  let full = false;
  const options: AnalysisOptions = {};
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    const value = (): string => {
      const v = argv[++i];
      if (v === undefined) throw new UsageError(`${arg}: a value is missing`);
      return v;
    };
    switch (arg) {
      case '--onsets':
        onsetsFile = value();
        break;
      case '--onset-label':
        options.onsetLabel = value();
        break;
      case '--kind': {
        const kind = value();
        if (kind !== 'task' && kind !== 'rest' && kind !== 'auto') {
          throw new UsageError(`--kind: expected task, rest or auto, got "${kind}"`);
        }
        options.kind = kind;
        break;
      }
      case '--band': {
        const [lo, hi] = parseNumberList('--band', value(), 2);
        if (!(lo > 0 && hi > lo))
          throw new UsageError(`--band: expected 0 < LO < HI, got ${lo},${hi}`);
        options.bandHz = [lo, hi];
        break;
      }
      case '--iaf':
        options.iafHz = parseNumberList('--iaf', value(), 1)[0];
        break;
      case '--method': {
        const method = value();
        if (method !== 'plateau' && method !== 'morlet') {
          throw new UsageError(`--method: expected plateau or morlet, got "${method}"`);
        }
        options.method = method;
        break;
      }
      case '--full':
        full = true;
        break;
      case '--help':
        throw new UsageError(USAGE);
      default:
        if (arg.startsWith('--')) throw new UsageError(`unknown option ${arg}\n${USAGE}`);
        if (file !== null)
          throw new UsageError(`one recording expected, got "${file}" and "${arg}"`);
        file = arg;
    }
  }
  if (file === null) throw new UsageError(`no recording given\n${USAGE}`);
  return { file, onsetsFile, options, full };
}

function onsetSummary(r: OnsetResult): Record<string, unknown> {
  return {
    baselineHz: r.baselineHz,
    postHz: r.postHz,
    deltaHz: r.deltaHz,
    ci95Hz: r.ci95Hz,
    p: r.p,
    wilcoxonMethod: r.wilcoxonMethod,
    suggestedFlag: r.suggestedFlag,
    trialsKept: r.trialsKept,
    trialsDropped: r.trialsDropped,
    dropReasons: r.dropReasons,
  };
}

/** The JSON document the CLI prints: the summary, or everything with `full`. */
export function cliReport(result: AnalysisResult, full: boolean): unknown {
  if (full) return result;
  return {
    kind: result.kind,
    channels: result.channels.map((c) => ({
      label: c.label,
      electrode: c.electrode,
      inRoi: c.inRoi,
      ...onsetSummary(c),
    })),
    roi: result.roi ? { channels: result.roi.channels, ...onsetSummary(result.roi) } : null,
    rest: result.rest
      ? {
          pafHz: result.rest.pafHz,
          cogHz: result.rest.cogHz,
          prominenceDb: result.rest.prominenceDb,
          noPeakReason: result.rest.noPeakReason,
          channels: result.rest.channels,
        }
      : null,
    qc: result.qc,
    settings: result.settings,
    warnings: result.warnings,
  };
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

export function main(argv: readonly string[]): number {
  try {
    const args = parseArguments(argv);
    let bytes: Uint8Array;
    try {
      bytes = readFileSync(args.file);
    } catch (error) {
      throw new UsageError(`${args.file}: cannot read the file (${(error as Error).message})`);
    }
    const recording = readEdf(bytes);
    if (args.onsetsFile !== null) {
      let text: string;
      try {
        text = readFileSync(args.onsetsFile, 'utf8');
      } catch (error) {
        throw new UsageError(
          `${args.onsetsFile}: cannot read the file (${(error as Error).message})`,
        );
      }
      const onsets = parseOnsetCsv(text, { recordingDurationS: recording.durationS });
      args.options.onsets = onsets.map((o) => ({ onsetS: o.onsetS, label: o.label }));
    }
    const result = analyzeRecording(recording, args.options);
    result.warnings.unshift(...recording.warnings);
    process.stdout.write(toJson(cliReport(result, args.full)) + '\n');
    return 0;
  } catch (error) {
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
  process.exitCode = main(process.argv.slice(2));
}
