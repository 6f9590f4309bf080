/**
 * `npm run crash-test [-- --seed N] [--kills N] [--quick] [--keep] [--probe-upload-race]
 *   [--json FILE]`
 *
 * Kills the built server (backend/dist) with SIGKILL at seeded moments during uploads and
 * computations, restarts it on the same data folder each time, lets it settle and checks what
 * is left (see crash/crash-checks.ts). Prints the figures; exits 1 when a check fails (the
 * data folder and server log are kept and named), 2 on a bad option. Needs a built backend.
 * `--quick`: shorter recordings (the in-suite run); `--probe-upload-race`: afterwards, two
 * concurrent uploads of one kind to one visit (crash/upload-race-probe.ts); `--json FILE`:
 * the whole report as JSON, for the jest test that runs this command.
 */
import { writeFileSync } from 'node:fs';
import { machineDescription } from './fuzz';
import { formatCrashReport, runCrashTest } from '../crash/crash-test';
import { FULL_SIZES, QUICK_SIZES } from '../crash/recording-files';
import { uploadRaceProbe } from '../crash/upload-race-probe';
import { exitWith } from './exit-with';

/** Fixed by default, so two runs of `npm run crash-test` follow the same schedule. */
export const DEFAULT_CRASH_SEED = 20260115;
export const DEFAULT_KILLS = 20;

async function main(): Promise<number> {
  let seed = DEFAULT_CRASH_SEED;
  let kills = DEFAULT_KILLS;
  let quick = false;
  let keep = false;
  let probe = false;
  let json: string | null = null;
  const argv = process.argv.slice(2);
  for (let i = 0; i < argv.length; i++) {
    const flag = argv[i];
    if (flag === '--seed' || flag === '--kills') {
      const n = Number(argv[++i]);
      if (!Number.isSafeInteger(n) || n < 0) {
        console.error(`${flag}: expected a non-negative integer`);
        return 2;
      }
      if (flag === '--seed') seed = n;
      else kills = n;
    } else if (flag === '--json' && argv[i + 1] !== undefined) json = argv[++i];
    else if (flag === '--quick') quick = true;
    else if (flag === '--keep') keep = true;
    else if (flag === '--probe-upload-race') probe = true;
    else {
      console.error(`unknown option ${flag}`);
      return 2;
    }
  }
  const report = await runCrashTest({
    seed,
    kills,
    sizes: quick ? QUICK_SIZES : FULL_SIZES,
    keepData: keep,
    log: (line) => console.log(line),
    probe: probe ? uploadRaceProbe : undefined,
  });
  console.log(formatCrashReport(report, machineDescription()));
  if (probe) console.log(`  upload race probe: ${JSON.stringify(report.probe)}`);
  if (keep) console.log(`data kept in ${report.dataDir}`);
  if (json !== null) writeFileSync(json, JSON.stringify(report, null, 2));
  return report.check.problems.length === 0 ? 0 : 1;
}

if (require.main === module) exitWith(main);
