/** The machine and software a benchmark figure was taken on, for results.json. */
import { execFileSync } from 'node:child_process';
import { availableParallelism, cpus, loadavg, totalmem } from 'node:os';
import { REPOSITORY_DIR } from './scipy-pipeline';

export interface MachineFacts {
  cores: number;
  cpuModel: string;
  memoryGb: number;
  node: string;
  gitCommit: string | null;
  /** Uncommitted changes in the tree when the figures were taken (they may be in them). */
  gitTreeChanged: boolean | null;
}

/** The 1-, 5- and 15-minute load averages, rounded to two decimals. */
export function loadAverage(): [number, number, number] {
  const [a, b, c] = loadavg().map((v) => Math.round(v * 100) / 100);
  return [a, b, c];
}

function git(args: string[]): string | null {
  try {
    return execFileSync('git', args, {
      cwd: REPOSITORY_DIR,
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'ignore'],
    }).trim();
  } catch {
    return null;
  }
}

export function machineFacts(): MachineFacts {
  const status = git(['status', '--porcelain']);
  return {
    cores: availableParallelism(),
    cpuModel: cpus()[0]?.model.trim() ?? 'unknown',
    memoryGb: Math.round((totalmem() / 2 ** 30) * 10) / 10,
    node: process.version,
    gitCommit: git(['rev-parse', 'HEAD']),
    gitTreeChanged: status === null ? null : status.length > 0,
  };
}
