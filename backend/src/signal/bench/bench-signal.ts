/**
 * Benchmark of the frequency-sliding pipeline against numpy/scipy (a script, not a
 * test): `npm run bench:signal [-- --minutes 10,60 --channels 64 --rate 500 --repeat 2]`.
 *
 * For each duration it writes a generated 64-channel 500 Hz EDF+ recording, then in
 * fresh processes (so that each peak memory is its own) runs
 *   - Gyre: read the EDF, then per channel band-pass + analytic signal (one FFT pair),
 *     instantaneous frequency, and the median across 10 running medians;
 *   - scripts/bench_scipy.py: the same steps with scipy.fft and scipy.ndimage.median_filter,
 * one after the other, both single-threaded, and prints wall and CPU time per stage
 * (CPU time of the whole process, so a loaded shared machine disturbs it less than the
 * wall clock), peak memory and the ratios Gyre / scipy. With `--repeat R` (default 2)
 * both sides run R times in turn and each stage keeps its fastest run, as the machine
 * may be shared. Reading the EDF is reported but left out of the totals (the two
 * readers do different work: Gyre's validates the whole file).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { readEdf } from '../edf/edf-reader';
import {
  defaultEdgePaddingS,
  FrequencySlidingOptions,
  FrequencySlidingWorkspace,
  medianFilterFrequency,
  medianWindowLengths,
  narrowBandAnalytic,
} from '../frequency/frequency-sliding';
import { phaseDifferenceFrequency } from '../frequency/instantaneous-frequency';
import { DEFAULT_TRANSITION_FRACTION } from '../frequency/spectral-weights';
import { DEFAULT_ANALYSIS_SETTINGS, resolveAnalysisBand } from '../pipeline/analysis-settings';
import { syntheticEdf, syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import { TEN_TEN_64 } from '../synthetic/ten-ten-64';

interface Stages {
  bandPassAnalytic: number;
  frequency: number;
  median: number;
}

interface GyreMeasurement {
  channels: number;
  samplesPerChannel: number;
  readEdfS: number;
  stagesS: Stages;
  stagesCpuS: Stages;
  peakRssMb: number;
}

interface ScipyMeasurement {
  numpy: string;
  scipy: string;
  channels: number;
  readEdfS: number;
  stagesS: Stages;
  stagesCpuS: Stages;
  peakRssMb: number;
}

function argument(name: string, fallback: string): string {
  const i = process.argv.indexOf(name);
  return i >= 0 && process.argv[i + 1] !== undefined ? process.argv[i + 1] : fallback;
}

/** Gyre's default settings without a resting IAF: the band every new study starts with. */
const BENCH_BAND_HZ = resolveAnalysisBand(DEFAULT_ANALYSIS_SETTINGS, null).bandHz;

function sliderOptions(fs: number): FrequencySlidingOptions {
  return { sampleRateHz: fs, bandHz: BENCH_BAND_HZ };
}

/** Child process 1: generate the recording and write the EDF+ file. */
function writeCase(path: string, minutes: number, channels: number, fs: number): void {
  const durationS = minutes * 60;
  const onsetsS: number[] = [];
  for (let t = 3; t < durationS - 3; t += 4) onsetsS.push(t);
  const recording = syntheticTaskRecording({
    sampleRateHz: fs,
    durationS,
    channelLabels: TEN_TEN_64.slice(0, channels),
    onsetsS,
    seed: 42,
  });
  writeFileSync(path, syntheticEdf(recording, { startDate: '2024-03-01T09:00:00' }));
}

/** Child process 2: Gyre's pipeline on the file, stage by stage, single-threaded. */
function measureGyre(path: string, checkPath: string): GyreMeasurement {
  const t0 = performance.now();
  const recording = readEdf(readFileSync(path));
  const readEdfS = (performance.now() - t0) / 1000;
  const stages: Stages = { bandPassAnalytic: 0, frequency: 0, median: 0 };
  const cpu: Stages = { bandPassAnalytic: 0, frequency: 0, median: 0 };
  const cpuS = (): number => {
    const u = process.cpuUsage();
    return (u.user + u.system) / 1e6;
  };
  const workspace = new FrequencySlidingWorkspace();
  // Caller-owned outputs, reused by every channel of the same length (no per-channel garbage).
  let raw = new Float64Array(0);
  let filtered = new Float64Array(0);
  recording.signals.forEach((signal, index) => {
    const options = sliderOptions(signal.sampleRateHz);
    const windows = medianWindowLengths({ sampleRateHz: signal.sampleRateHz });
    if (raw.length !== signal.samples.length - 1) {
      raw = new Float64Array(signal.samples.length - 1);
      filtered = new Float64Array(signal.samples.length - 1);
    }
    const a = performance.now();
    const ca = cpuS();
    const z = narrowBandAnalytic(signal.samples, options, workspace);
    const b = performance.now();
    const cb = cpuS();
    phaseDifferenceFrequency(z, { sampleRateHz: signal.sampleRateHz }, raw);
    const c = performance.now();
    const cc = cpuS();
    medianFilterFrequency(raw, windows, workspace, filtered);
    const d = performance.now();
    const cd = cpuS();
    stages.bandPassAnalytic += (b - a) / 1000;
    stages.frequency += (c - b) / 1000;
    stages.median += (d - c) / 1000;
    cpu.bandPassAnalytic += cb - ca;
    cpu.frequency += cc - cb;
    cpu.median += cd - cc;
    if (index === 0) writeFileSync(checkPath, new Uint8Array(filtered.buffer));
  });
  return {
    channels: recording.signals.length,
    samplesPerChannel: recording.signals[0].samples.length,
    readEdfS,
    stagesS: stages,
    stagesCpuS: cpu,
    peakRssMb: process.resourceUsage().maxRSS / 1024,
  };
}

function runChild(args: string[]): string {
  const child = spawnSync(process.execPath, [__filename, ...args], {
    encoding: 'utf8',
    maxBuffer: 1 << 24,
  });
  if (child.status !== 0) {
    throw new Error(`bench child ${args.join(' ')} failed:\n${child.stderr}`);
  }
  return child.stdout;
}

/** The 1, 5 and 15 min load averages: figures from a shared machine need them beside. */
function loadAverage(): string {
  return loadavg()
    .map((x) => x.toFixed(2))
    .join(' ');
}

function format(seconds: number): string {
  return seconds.toFixed(2).padStart(8);
}

function compareCheck(gyrePath: string, scipyPath: string, fs: number): number {
  const read = (p: string): Float64Array => {
    const b = readFileSync(p);
    return new Float64Array(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength));
  };
  const a = read(gyrePath);
  const b = read(scipyPath);
  let worst = 0;
  for (let i = fs; i < Math.min(a.length, b.length) - fs; i++)
    worst = Math.max(worst, Math.abs(a[i] - b[i]));
  return worst;
}

function runCase(minutes: number, channels: number, fs: number, dir: string, repeat: number): void {
  const path = join(dir, `bench-${minutes}min.edf`);
  const gyreCheck = join(dir, `gyre-${minutes}.f64`);
  const scipyCheck = join(dir, `scipy-${minutes}.f64`);
  const w0 = performance.now();
  runChild(['--child-write', path, String(minutes), String(channels), String(fs)]);
  console.log(
    `\n${channels} channels × ${minutes} min at ${fs} Hz (generated, written in ${((performance.now() - w0) / 1000).toFixed(1)} s)`,
  );
  const options = sliderOptions(fs);
  const band = options.bandHz;
  const runScipy = (): ScipyMeasurement => {
    const python = spawnSync(
      'python3',
      [
        resolve(__dirname, '../../../scripts/bench_scipy.py'),
        path,
        '--band',
        band.join(','),
        '--transition',
        String(DEFAULT_TRANSITION_FRACTION),
        '--padding-s',
        String(defaultEdgePaddingS(options)),
        '--windows',
        medianWindowLengths({ sampleRateHz: fs }).join(','),
        '--check-out',
        scipyCheck,
      ],
      { encoding: 'utf8', maxBuffer: 1 << 24 },
    );
    if (python.status !== 0) throw new Error(`bench_scipy.py failed:\n${python.stderr}`);
    return JSON.parse(python.stdout) as ScipyMeasurement;
  };
  // The machine may be shared: run both sides in turn `repeat` times and keep each
  // side's fastest run per stage (the least disturbed one).
  const gyreRuns: GyreMeasurement[] = [];
  const scipyRuns: ScipyMeasurement[] = [];
  for (let r = 0; r < repeat; r++) {
    gyreRuns.push(JSON.parse(runChild(['--child-measure', path, gyreCheck])) as GyreMeasurement);
    scipyRuns.push(runScipy());
  }
  const fastestStages = (all: Stages[]): Stages => ({
    bandPassAnalytic: Math.min(...all.map((x) => x.bandPassAnalytic)),
    frequency: Math.min(...all.map((x) => x.frequency)),
    median: Math.min(...all.map((x) => x.median)),
  });
  const fastest = <
    T extends { stagesS: Stages; stagesCpuS: Stages; readEdfS: number; peakRssMb: number },
  >(
    runs: T[],
  ): T => ({
    ...runs[0],
    readEdfS: Math.min(...runs.map((x) => x.readEdfS)),
    peakRssMb: Math.max(...runs.map((x) => x.peakRssMb)),
    stagesS: fastestStages(runs.map((x) => x.stagesS)),
    stagesCpuS: fastestStages(runs.map((x) => x.stagesCpuS)),
  });
  const gyre = fastest(gyreRuns);
  const scipy = fastest(scipyRuns);
  const sum = (x: Stages): number => x.bandPassAnalytic + x.frequency + x.median;
  const totals = (runs: { stagesS: Stages; stagesCpuS: Stages }[]): string =>
    runs.map((x) => `${sum(x.stagesS).toFixed(2)}/${sum(x.stagesCpuS).toFixed(2)}`).join(', ');
  console.log(
    `runs (total wall/CPU s): Gyre ${totals(gyreRuns)}; scipy ${totals(scipyRuns)}` +
      ` [numpy ${scipy.numpy}, scipy ${scipy.scipy}; load average ${loadAverage()}]`,
  );
  const stageNames: [keyof Stages, string][] = [
    ['bandPassAnalytic', 'band-pass + analytic'],
    ['frequency', 'instantaneous freq.'],
    ['median', '10-window median'],
  ];
  const rows: [string, number, number, number, number][] = [
    ...stageNames.map(([key, name]): [string, number, number, number, number] => [
      name,
      gyre.stagesS[key],
      scipy.stagesS[key],
      gyre.stagesCpuS[key],
      scipy.stagesCpuS[key],
    ]),
    ['total', sum(gyre.stagesS), sum(scipy.stagesS), sum(gyre.stagesCpuS), sum(scipy.stagesCpuS)],
  ];
  const columns = [
    'wall Gyre (s)',
    'scipy (s)',
    'Gyre/scipy',
    'CPU Gyre (s)',
    'scipy (s)',
    'Gyre/scipy',
  ];
  console.log(`${'stage'.padEnd(22)}${columns.map((c) => c.padStart(14)).join('')}`);
  for (const [name, g, s, gc, sc] of rows) {
    const ratio = (a: number, b: number): string => `${(a / b).toFixed(2)}×`;
    const cells = [format(g), format(s), ratio(g, s), format(gc), format(sc), ratio(gc, sc)];
    console.log(`${name.padEnd(22)}${cells.map((c) => c.padStart(14)).join('')}`);
  }
  console.log(
    `${'read EDF, not in total'.padEnd(22)}${format(gyre.readEdfS).padStart(14)}${format(scipy.readEdfS).padStart(14)}`,
  );
  console.log(
    `${'peak memory (MB)'.padEnd(22)}${gyre.peakRssMb.toFixed(0).padStart(14)}${scipy.peakRssMb.toFixed(0).padStart(14)}`,
  );
  console.log(
    `check: channel 1 final frequency, max |Gyre − scipy| 1 s away from the edges = ${compareCheck(gyreCheck, scipyCheck, fs).toExponential(2)} Hz`,
  );
  for (const p of [path, gyreCheck, scipyCheck]) rmSync(p, { force: true });
}

function main(): void {
  const argv = process.argv;
  if (argv[2] === '--child-write') {
    writeCase(argv[3], Number(argv[4]), Number(argv[5]), Number(argv[6]));
    return;
  }
  if (argv[2] === '--child-measure') {
    process.stdout.write(JSON.stringify(measureGyre(argv[3], argv[4])));
    return;
  }
  const minutes = argument('--minutes', '10,60').split(',').map(Number);
  const channels = Number(argument('--channels', '64'));
  const fs = Number(argument('--rate', '500'));
  const repeat = Math.max(1, Number(argument('--repeat', '2')));
  const dir = mkdtempSync(join(tmpdir(), 'gyre-bench-'));
  console.log('Gyre signal benchmark: single-threaded, Gyre and scipy run one after the other.');
  try {
    for (const m of minutes) runCase(m, channels, fs, dir, repeat);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main();
