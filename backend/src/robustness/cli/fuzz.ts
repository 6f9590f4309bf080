/**
 * `npm run fuzz [-- --seed N] [--cases N] [--first N] [--case N] [--save DIR]`
 *
 * Seeded mutations of valid EDF/EDF+ files and onset CSVs, each run through the server's
 * upload validation (`validateRecording`) in a worker thread with a 256 MB heap. Prints the
 * figures and exits 1 on any violation (an exception other than the signal core's clear
 * errors, a rejection without a field, an implausible result, more than 1 s or 256 MB, a hang
 * or a crash), 2 on a bad option. `--case N` replays one case and prints what it was and what
 * it gave; `--save DIR` writes the input of every violating case there.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { availableParallelism, cpus, totalmem } from 'node:os';
import { join } from 'node:path';
import { buildCase } from '../fuzz/fuzz-cases';
import { formatSummary } from '../fuzz/fuzz-report';
import { rangeOf, runFuzz } from '../fuzz/fuzz-runner';
import { exitWith } from './exit-with';

/** The default seed: a fixed one, so that two runs of `npm run fuzz` are the same run. */
export const DEFAULT_FUZZ_SEED = 20260115;
export const DEFAULT_FUZZ_CASES = 10_000;

interface Arguments {
  seed: number;
  cases: number;
  first: number;
  replay: number | null;
  saveDir: string | null;
}

class UsageError extends Error {}

function integer(flag: string, value: string | undefined): number {
  const n = Number(value);
  if (value === undefined || !Number.isSafeInteger(n) || n < 0) {
    throw new UsageError(`${flag}: expected a non-negative integer, got ${String(value)}`);
  }
  return n;
}

export function parseFuzzArguments(argv: readonly string[]): Arguments {
  const args: Arguments = {
    seed: DEFAULT_FUZZ_SEED,
    cases: DEFAULT_FUZZ_CASES,
    first: 0,
    replay: null,
    saveDir: null,
  };
  for (let i = 0; i < argv.length; i++) {
    const flag = argv[i];
    const value = argv[i + 1];
    if (flag === '--seed') args.seed = integer(flag, value);
    else if (flag === '--cases') args.cases = integer(flag, value);
    else if (flag === '--first') args.first = integer(flag, value);
    else if (flag === '--case') args.replay = integer(flag, value);
    else if (flag === '--save') args.saveDir = value ?? '';
    else throw new UsageError(`unknown option ${flag}`);
    i++;
  }
  return args;
}

export function machineDescription(): string {
  const cpu = cpus()[0]?.model.trim() ?? 'unknown CPU';
  return `${availableParallelism()} cores (${cpu}), ${(totalmem() / 2 ** 30).toFixed(0)} GB, Node ${process.version}`;
}

async function main(): Promise<number> {
  let args: Arguments;
  try {
    args = parseFuzzArguments(process.argv.slice(2));
  } catch (error) {
    if (!(error instanceof UsageError)) throw error;
    console.error(error.message);
    return 2;
  }
  const indices = args.replay !== null ? [args.replay] : rangeOf(args.first, args.cases);
  const save = (index: number): void => {
    if (args.saveDir === null) return;
    const fuzzCase = buildCase(args.seed, index);
    mkdirSync(args.saveDir, { recursive: true });
    writeFileSync(join(args.saveDir, `seed-${args.seed}-case-${index}.edf`), fuzzCase.edf);
    if (fuzzCase.onsetsCsv !== null) {
      writeFileSync(join(args.saveDir, `seed-${args.seed}-case-${index}.csv`), fuzzCase.onsetsCsv);
    }
  };
  let done = 0;
  const summary = await runFuzz({
    seed: args.seed,
    indices,
    onCase: (fuzzCase, result) => {
      done += 1;
      if (args.replay !== null) {
        console.log(`case ${fuzzCase.index} of seed ${fuzzCase.seed}`);
        console.log(
          `  shape ${fuzzCase.shape}, kind ${fuzzCase.kind}, ${fuzzCase.edf.length} bytes`,
        );
        console.log(`  mutation ${fuzzCase.mutation}`);
        if (fuzzCase.onsetsCsv !== null) {
          console.log(`  onset CSV ${JSON.stringify(fuzzCase.onsetsCsv.slice(0, 300))}`);
        }
        console.log(`  judged ${result.judgement.kind}; ${result.message ?? 'no message'}`);
        for (const v of result.judgement.violations) console.log(`  ${v.kind}: ${v.detail}`);
        console.log(`  ${result.elapsedMs?.toFixed(2) ?? '-'} ms`);
      }
      if (result.judgement.violations.length > 0) {
        console.log(
          `case ${fuzzCase.index}: ${result.judgement.violations.map((v) => v.kind).join(', ')} (seed ${fuzzCase.seed})`,
        );
        save(fuzzCase.index);
      }
      if (done % 1000 === 0) console.log(`… ${done} of ${indices.length} cases`);
    },
  });
  if (args.replay !== null && args.saveDir !== null) save(args.replay);
  console.log(formatSummary(summary, machineDescription()));
  return summary.violations.length === 0 ? 0 : 1;
}

if (require.main === module) exitWith(main);
