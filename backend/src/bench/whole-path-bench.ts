/**
 * `npm run bench [-- --minutes 10,60] [--repeat 1] [--channels 64] [--rate 500] [--out DIR]`
 *
 * The whole-path benchmark of Gyre against numpy/scipy (a script, not a test; see
 * bench/README.md). For each length it generates a task recording as EDF+, then measures in
 * fresh processes, `--repeat` times in turn:
 *   - Gyre as the server runs it (gyre-whole-path.ts): upload through the HTTP API,
 *     validation, computation in the worker pool, results stored;
 *   - bench/scipy_pipeline.py doing the same computation in one process, then in two.
 * Each side keeps its run with the least wall time. Prints a table with the ratios, whether
 * the issue's targets hold (it never fails on them) and whether both sides' region-of-interest
 * Δf agree, then writes results.json and results.svg to `--out` (default bench/).
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import {
  BenchCase,
  best,
  CaseJudgement,
  CaseSpec,
  formatCase,
  judgeCase,
  megabytes,
  AGREEMENT_TOLERANCE_HZ,
  TARGETS,
} from './bench-results';
import { CPU_SAMPLE_INTERVAL_MS, GyreRun, STATE_POLL_INTERVAL_MS } from './gyre-whole-path';
import { loadAverage, machineFacts } from './machine-facts';
import { resultsChartSvg } from './results-chart';
import { REPOSITORY_DIR, runScipyPipeline, ScipyRun } from './scipy-pipeline';

class UsageError extends Error {}

interface Arguments {
  minutes: number[];
  repeat: number;
  channels: number;
  rateHz: number;
  outDir: string;
}

export function parseBenchArguments(argv: readonly string[]): Arguments {
  const args: Arguments = {
    minutes: [10, 60],
    repeat: 1,
    channels: 64,
    rateHz: 500,
    outDir: join(REPOSITORY_DIR, 'bench'),
  };
  const positive = (name: string, text: string | undefined, integer: boolean): number => {
    const value = Number(text);
    if (text === undefined || !(value > 0) || (integer && !Number.isInteger(value))) {
      throw new UsageError(
        `${name}: ${integer ? 'a positive whole number' : 'a positive number'} expected, got ${text ?? 'nothing'}`,
      );
    }
    return value;
  };
  for (let i = 0; i < argv.length; i += 2) {
    const [name, value] = [argv[i], argv[i + 1]];
    if (name === '--minutes') {
      args.minutes = (value ?? '').split(',').map((m) => positive('--minutes', m, false));
    } else if (name === '--repeat') args.repeat = positive(name, value, true);
    else if (name === '--channels') args.channels = positive(name, value, true);
    else if (name === '--rate') args.rateHz = positive(name, value, true);
    else if (name === '--out') {
      if (!value) throw new UsageError('--out: a folder expected');
      args.outDir = resolve(value);
    } else {
      throw new UsageError(
        `unknown option ${name}; expected --minutes LIST, --repeat N, --channels N, --rate HZ, --out DIR`,
      );
    }
  }
  return args;
}

/** Runs a compiled module of this folder in a fresh Node.js process; its stdout. */
function runNode(module: string, args: string[]): string {
  const child = spawnSync(process.execPath, [join(__dirname, module), ...args], {
    encoding: 'utf8',
    maxBuffer: 1 << 26,
  });
  if (child.status !== 0) {
    throw new Error(`${module} ${args.join(' ')} exited with ${child.status}:\n${child.stderr}`);
  }
  return child.stdout;
}

function measureCase(spec: CaseSpec, repeat: number, dir: string): BenchCase {
  const path = join(dir, `bench-${spec.minutes}min.edf`);
  const loadAverageBefore = loadAverage();
  const w0 = performance.now();
  runNode('bench-recording.js', [
    path,
    String(spec.minutes),
    String(spec.channels),
    String(spec.rateHz),
  ]);
  const writeS = (performance.now() - w0) / 1000;
  const gyreRuns: GyreRun[] = [];
  const scipy1Runs: ScipyRun[] = [];
  const scipy2Runs: ScipyRun[] = [];
  try {
    for (let r = 0; r < repeat; r++) {
      console.log(`  run ${r + 1} of ${repeat}: Gyre, scipy 1 process, scipy 2 processes…`);
      gyreRuns.push(JSON.parse(runNode('gyre-whole-path.js', [path])) as GyreRun);
      scipy1Runs.push(runScipyPipeline(path, spec.rateHz, 1));
      scipy2Runs.push(runScipyPipeline(path, spec.rateHz, 2));
    }
    return {
      ...spec,
      fileBytes: statSync(path).size,
      onsets: scipy1Runs[0].onsets,
      writeS,
      loadAverageBefore,
      loadAverageAfter: loadAverage(),
      gyre: best(gyreRuns, (x) => x.stages.total.wallS),
      scipy1: best(scipy1Runs, (x) => x.wallS),
      scipy2: best(scipy2Runs, (x) => x.wallS),
      runs: {
        gyreWallS: gyreRuns.map((x) => x.stages.total.wallS),
        scipy1WallS: scipy1Runs.map((x) => x.wallS),
        scipy2WallS: scipy2Runs.map((x) => x.wallS),
      },
    };
  } finally {
    rmSync(path, { force: true });
  }
}

const round = (v: number, digits = 3): number => Number(v.toFixed(digits));

function scipyFigures(run: ScipyRun): Record<string, unknown> {
  const steps = (record: Record<string, unknown>): Record<string, unknown> =>
    Object.fromEntries(
      Object.entries(record).map(([k, v]) => [
        k,
        typeof v === 'number' ? round(v) : steps(v as Record<string, unknown>),
      ]),
    );
  return {
    processes: run.processes,
    wallS: round(run.wallS),
    cpuS: round(run.cpuS),
    peakMb: Math.round(run.peakRssMb.processMb),
    ...(run.peakRssMb.childrenMb
      ? {
          peakMbPerChild: run.peakRssMb.childrenMb.map((v) => Math.round(v)),
          parentPeakMb: Math.round(run.peakRssMb.parentMb ?? 0),
        }
      : {}),
    stepWallS: steps(run.stepWallS),
    stepCpuS: steps(run.stepCpuS),
    roi: { deltaFHz: run.roi.deltaFHz, ciHz: run.roi.ciHz, pValue: run.roi.pValue },
  };
}

function caseDocument(c: BenchCase, j: CaseJudgement): Record<string, unknown> {
  const stage = (s: { wallS: number; cpuS: number }): { wallS: number; cpuS: number } => ({
    wallS: round(s.wallS),
    cpuS: round(s.cpuS),
  });
  return {
    minutes: c.minutes,
    channels: c.channels,
    rateHz: c.rateHz,
    fileMb: megabytes(c.fileBytes),
    onsets: c.onsets,
    loadAverageBefore: c.loadAverageBefore,
    loadAverageAfter: c.loadAverageAfter,
    gyre: {
      stages: {
        upload: stage(c.gyre.stages.upload),
        validation: stage(c.gyre.stages.validation),
        computation: stage(c.gyre.stages.computation),
        total: stage(c.gyre.stages.total),
      },
      uploadAnsweredS: round(c.gyre.answerS),
      readyObservedS: round(c.gyre.readyObservedS),
      serverPeakMb: megabytes(c.gyre.server.peakBytes),
      serverIdleMb: megabytes(c.gyre.server.idleBytes),
      polls: c.gyre.server.polls,
      serverCpuPerPollMs: round(c.gyre.server.cpuPerPollS * 1000, 2),
      client: { cpuS: round(c.gyre.client.cpuS), peakMb: megabytes(c.gyre.client.peakBytes) },
      roi: c.gyre.roi,
    },
    scipy1: scipyFigures(c.scipy1),
    scipy2: scipyFigures(c.scipy2),
    runsWallS: {
      gyre: c.runs.gyreWallS.map((v) => round(v)),
      scipy1: c.runs.scipy1WallS.map((v) => round(v)),
      scipy2: c.runs.scipy2WallS.map((v) => round(v)),
    },
    ratios: Object.fromEntries(Object.entries(j.ratios).map(([k, v]) => [k, round(v)])),
    targets: j.targets,
    agreement: j.agreement,
  };
}

/** Writes `value` as JSON formatted by the repository's Prettier settings (npm run lint checks it). */
async function writeFormattedJson(path: string, value: unknown): Promise<void> {
  const prettier = await import('prettier');
  const config = (await prettier.resolveConfig(path)) ?? {};
  writeFileSync(path, await prettier.format(JSON.stringify(value), { ...config, filepath: path }));
}

async function main(): Promise<number> {
  let args: Arguments;
  try {
    args = parseBenchArguments(process.argv.slice(2));
  } catch (error) {
    if (!(error instanceof UsageError)) throw error;
    console.error(`npm run bench: ${error.message}`);
    return 2;
  }
  const facts = machineFacts();
  const loadBefore = loadAverage();
  console.log(
    `npm run bench on ${facts.cores} cores (${facts.cpuModel}), Node ${facts.node}; load average ${loadBefore.join(' ')}`,
  );
  const dir = mkdtempSync(join(tmpdir(), 'gyre-bench-'));
  const cases: { c: BenchCase; j: CaseJudgement }[] = [];
  try {
    for (const minutes of args.minutes) {
      const spec = { minutes, channels: args.channels, rateHz: args.rateHz };
      console.log(`\n${spec.channels} channels × ${minutes} min at ${spec.rateHz} Hz`);
      const c = measureCase(spec, args.repeat, dir);
      const j = judgeCase(c);
      console.log(formatCase(c, j));
      cases.push({ c, j });
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  const loadAfter = loadAverage();
  const first = cases[0].c.scipy1;
  const generatedAt = new Date().toISOString();
  const document = {
    generatedAt,
    command: `npm run bench -- --minutes ${args.minutes.join(',')} --repeat ${args.repeat} --channels ${args.channels} --rate ${args.rateHz}`,
    machine: {
      ...facts,
      python: first.python,
      numpy: first.numpy,
      scipy: first.scipy,
      loadAverageBefore: loadBefore,
      loadAverageAfter: loadAfter,
    },
    conditions: {
      repeat: args.repeat,
      best: 'each side keeps its run with the least wall time',
      serverCpuSampleMs: CPU_SAMPLE_INTERVAL_MS,
      recordingPollMs: STATE_POLL_INTERVAL_MS,
      units: 'seconds; MB = 10^6 bytes',
    },
    targets: TARGETS,
    agreementToleranceHz: AGREEMENT_TOLERANCE_HZ,
    cases: cases.map(({ c, j }) => caseDocument(c, j)),
  };
  mkdirSync(args.outDir, { recursive: true });
  const jsonPath = join(args.outDir, 'results.json');
  const svgPath = join(args.outDir, 'results.svg');
  await writeFormattedJson(jsonPath, document);
  writeFileSync(
    svgPath,
    resultsChartSvg(
      cases.map(({ c }) => ({
        title: `${c.channels} ch × ${c.minutes} min at ${c.rateHz} Hz`,
        gyre: c.gyre.stages.total,
        scipy1: c.scipy1,
        scipy2: c.scipy2,
      })),
      `${facts.cores} cores, ${facts.cpuModel}; load average ${loadBefore[0]} before, ${loadAfter[0]} after; ${generatedAt.slice(0, 10)}, commit ${facts.gitCommit?.slice(0, 7) ?? 'unknown'}${facts.gitTreeChanged ? ' with changes' : ''}; numpy ${first.numpy}, scipy ${first.scipy}`,
    ),
  );
  console.log(`\nload average ${loadBefore.join(' ')} before, ${loadAfter.join(' ')} after`);
  console.log(`wrote ${jsonPath} and ${svgPath}`);
  return 0;
}

if (require.main === module) {
  main().then(
    (code) => process.exit(code),
    (error: unknown) => {
      console.error(
        `npm run bench: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`,
      );
      process.exit(1);
    },
  );
}
