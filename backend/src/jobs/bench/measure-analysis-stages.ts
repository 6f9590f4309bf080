/**
 * Where one analysis's CPU goes, stage by stage: the worker's own code path (`runAnalysis`:
 * the parts one after another in this thread, then the merge), with the CPU time, the
 * calls and the page faults (first touches of fresh memory) of each stage. Not a test: run
 * by hand on a built tree, one process per figure.
 *
 *   npm run build -w backend
 *   node backend/dist/bench/bench-recording.js /tmp/b60.edf 60 64 500
 *   node backend/dist/jobs/bench/measure-analysis-stages.js /tmp/b60.edf [--parts 2]
 *
 * The stages are timed by replacing the signal core's exported functions with timed
 * wrappers before the run: the compiled modules are CommonJS and look each other's functions
 * up on the exports objects at every call, so calls between modules go through the wrappers (calls inside one
 * module do not, which is why e.g. the bootstrap shows inside `onsetStatistics`). Stages
 * nest (`frequencySliding` holds the analytic signal, the instantaneous frequency and the
 * medians); "reading and planning" is what the run spent outside every analysed channel
 * and the merge. CPU is the process's (user + system), so run it on a quiet machine.
 * Prints one JSON document with the load average before and after.
 */
import { loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { defaultAnalyzeTaskOfFile } from '../default-analyze-task';
import { runAnalysis } from '../worker/run-analysis';

/** [module under dist/, exported function] of every timed stage, in pipeline order. */
const STAGES: ReadonlyArray<readonly [string, string]> = [
  ['signal/pipeline/analyze-channels', 'analyzeChannels'],
  ['signal/spectrum/welch', 'welchPowerSpectrum'],
  ['signal/quality/quality-checks', 'channelQuality'],
  ['signal/frequency/frequency-sliding', 'frequencySlidingInWorkspace'],
  ['signal/frequency/analytic-signal', 'analyticSignal'],
  ['signal/frequency/instantaneous-frequency', 'phaseDifferenceFrequency'],
  ['signal/frequency/running-median', 'runningMedianChunks'],
  ['signal/frequency/median-across', 'medianAcross'],
  ['signal/trials/epochs', 'epochExceedsAmplitude'],
  ['signal/trials/epochs', 'cutFrequencyEpochs'],
  ['signal/pipeline/summarise-onsets', 'summariseOnsets'],
  ['signal/trials/onset-statistics', 'onsetStatistics'],
  ['signal/trials/onset-statistics', 'onsetCurve'],
  ['signal/pipeline/merge-channel-parts', 'mergeChannelParts'],
  ['signal/pipeline/run-summary', 'toAnalyzeOutcome'],
];

interface Usage {
  cpuMs: number;
  faults: number;
}

function usageNow(): Usage {
  const u = process.resourceUsage();
  return { cpuMs: (u.userCPUTime + u.systemCPUTime) / 1000, faults: u.minorPageFault };
}

interface StageFigures {
  calls: number;
  cpuS: number;
  minorPageFaults: number;
}

/** Replaces each stage's export with a timed wrapper; the figures fill in as the run goes. */
function instrument(): Map<string, StageFigures> {
  const figures = new Map<string, StageFigures>();
  for (const [module, name] of STAGES) {
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const exports = require(`../../${module}`) as Record<string, unknown>;
    const original = exports[name];
    if (typeof original !== 'function') throw new Error(`${module}: no function ${name}`);
    const entry: StageFigures = { calls: 0, cpuS: 0, minorPageFaults: 0 };
    figures.set(name, entry);
    Object.defineProperty(exports, name, {
      configurable: true,
      enumerable: true,
      value: function timed(this: unknown, ...args: unknown[]): unknown {
        const before = usageNow();
        try {
          return (original as (...a: unknown[]) => unknown).apply(this, args);
        } finally {
          const after = usageNow();
          entry.calls++;
          entry.cpuS += (after.cpuMs - before.cpuMs) / 1000;
          entry.minorPageFaults += after.faults - before.faults;
        }
      },
    });
  }
  return figures;
}

async function main(): Promise<void> {
  const [path, flag, value] = process.argv.slice(2);
  const parts = flag === '--parts' ? Number(value) : 2;
  if (!path || !(Number.isInteger(parts) && parts >= 1)) {
    throw new Error('usage: measure-analysis-stages.js FILE.edf [--parts N] (N ≥ 1, default 2)');
  }
  const task = await defaultAnalyzeTaskOfFile(path);
  const figures = instrument();
  const load = (): number[] => loadavg().map((v) => Number(v.toFixed(2)));
  const loadBefore = load();
  const start = usageNow();
  const t0 = performance.now();
  const outcome = await runAnalysis(task, () => undefined, { parts });
  const wallS = (performance.now() - t0) / 1000;
  const end = usageNow();
  const cpuS = (end.cpuMs - start.cpuMs) / 1000;
  const outside = ['analyzeChannels', 'mergeChannelParts', 'toAnalyzeOutcome'].reduce(
    (rest, name) => rest - (figures.get(name)?.cpuS ?? 0),
    cpuS,
  );
  const round = (v: number): number => Number(v.toFixed(3));
  console.log(
    JSON.stringify(
      {
        file: path,
        parts,
        channels: outcome.summary.channels.length,
        deltaFHz: outcome.summary.roi?.deltaFHz,
        wallS: round(wallS),
        cpuS: round(cpuS),
        minorPageFaults: end.faults - start.faults,
        readingAndPlanningCpuS: round(outside),
        stages: Object.fromEntries(
          [...figures].map(([name, f]) => [
            name,
            { calls: f.calls, cpuS: round(f.cpuS), minorPageFaults: f.minorPageFaults },
          ]),
        ),
        peakRssMb: Math.round(process.resourceUsage().maxRSS / 1024),
        loadBefore,
        loadAfter: load(),
      },
      null,
      2,
    ),
  );
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
