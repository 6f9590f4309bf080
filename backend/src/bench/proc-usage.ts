/**
 * CPU time and peak memory of another process, read from Linux's /proc (proc(5)): the server
 * runs as a child process, so `process.cpuUsage()` cannot see it. The figures cover the whole
 * process, every thread included (piscina's worker threads are threads of the server).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';

/** One reading: when it was taken (ms, same clock as `Date.now()`) and the CPU seconds used. */
export interface CpuSample {
  atMs: number;
  cpuS: number;
}

let ticksPerSecond: number | null = null;

/** Clock ticks per second of /proc/<pid>/stat's time fields (`getconf CLK_TCK`, usually 100). */
export function clockTicksPerSecond(): number {
  if (ticksPerSecond === null) {
    const value = Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim());
    if (!Number.isInteger(value) || value <= 0) {
      throw new Error(`getconf CLK_TCK: a positive integer expected, got "${value}"`);
    }
    ticksPerSecond = value;
  }
  return ticksPerSecond;
}

/**
 * utime + stime in clock ticks from the text of /proc/<pid>/stat. The second field (the
 * command name) is in parentheses and may itself hold spaces and parentheses, so fields are
 * counted after the last ')': utime and stime are fields 14 and 15 (proc(5)).
 */
export function parseStatTicks(statText: string): number {
  const close = statText.lastIndexOf(')');
  if (close < 0) throw new Error('/proc/<pid>/stat: no ")" after the command name');
  // After ')' come field 3 (state) onwards.
  const fields = statText
    .slice(close + 1)
    .trim()
    .split(/\s+/);
  const utime = Number(fields[14 - 3]);
  const stime = Number(fields[15 - 3]);
  if (!Number.isFinite(utime) || !Number.isFinite(stime)) {
    throw new Error('/proc/<pid>/stat: fields 14 (utime) and 15 (stime) are not numbers');
  }
  return utime + stime;
}

/** CPU seconds (user + system, all threads) the process has used so far. */
export function processCpuS(pid: number): number {
  return parseStatTicks(readFileSync(`/proc/${pid}/stat`, 'utf8')) / clockTicksPerSecond();
}

/** A memory line of /proc/<pid>/status (e.g. VmHWM, VmRSS) in bytes; its unit is kB = 1024 B. */
export function parseStatusBytes(statusText: string, key: 'VmHWM' | 'VmRSS'): number {
  const line = statusText.split('\n').find((l) => l.startsWith(`${key}:`));
  const match = line?.match(/^\w+:\s+(\d+)\s+kB$/);
  if (!match) throw new Error(`/proc/<pid>/status: no "${key}: N kB" line`);
  return Number(match[1]) * 1024;
}

/** Peak resident memory of the process so far (VmHWM), bytes. */
export function processPeakBytes(pid: number): number {
  return parseStatusBytes(readFileSync(`/proc/${pid}/status`, 'utf8'), 'VmHWM');
}

/** Resident memory of the process now (VmRSS), bytes. */
export function processResidentBytes(pid: number): number {
  return parseStatusBytes(readFileSync(`/proc/${pid}/status`, 'utf8'), 'VmRSS');
}

/**
 * CPU seconds at `atMs`, linearly interpolated between the samples around it (samples sorted
 * by time); before the first or after the last sample, the nearest sample. A stage boundary
 * the server stamps between two 50 ms samples is thus placed within one sample's worth of CPU.
 */
export function cpuAt(samples: readonly CpuSample[], atMs: number): number {
  if (samples.length === 0) throw new Error('cpuAt: no CPU sample');
  if (atMs <= samples[0].atMs) return samples[0].cpuS;
  for (let i = 1; i < samples.length; i++) {
    const b = samples[i];
    if (atMs <= b.atMs) {
      const a = samples[i - 1];
      const span = b.atMs - a.atMs;
      return span > 0 ? a.cpuS + ((b.cpuS - a.cpuS) * (atMs - a.atMs)) / span : b.cpuS;
    }
  }
  return samples[samples.length - 1].cpuS;
}

/** Samples a process's CPU every `intervalMs` until stopped (plus on demand with `now()`). */
export class CpuSampler {
  readonly samples: CpuSample[] = [];
  private timer: NodeJS.Timeout | null = null;

  constructor(
    private readonly pid: number,
    private readonly intervalMs: number,
  ) {}

  start(): void {
    this.now();
    this.timer = setInterval(() => this.now(), this.intervalMs);
  }

  /** Takes a sample at once and returns it. */
  now(): CpuSample {
    const sample = { atMs: wallClockMs(), cpuS: processCpuS(this.pid) };
    this.samples.push(sample);
    return sample;
  }

  stop(): void {
    if (this.timer !== null) clearInterval(this.timer);
    this.timer = null;
    this.now();
  }
}

/** Milliseconds on the `Date.now()` clock with sub-millisecond resolution. */
export function wallClockMs(): number {
  return performance.timeOrigin + performance.now();
}
