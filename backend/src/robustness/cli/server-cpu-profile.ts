/**
 * Preloaded (`node --require`, through NODE_OPTIONS) into the server that
 * `npm run load -- --cpu-prof DIR` starts: Node refuses `--cpu-prof` in NODE_OPTIONS, so this
 * records the same profile with the inspector's Profiler domain and writes it to
 * `$GYRE_CPU_PROFILE_DIR/server-<pid>.cpuprofile` (Chrome DevTools, Performance panel) when the
 * server exits. Nest's shutdown hooks close the app on SIGTERM, remove their listener and
 * raise the signal again; this listener is then the only one left and exits normally.
 */
import { writeFileSync } from 'node:fs';
import { Session } from 'node:inspector';
import { join } from 'node:path';

const dir = process.env.GYRE_CPU_PROFILE_DIR;
if (dir !== undefined && dir !== '') {
  const session = new Session();
  session.connect();
  session.post('Profiler.enable');
  // 500 µs between samples: a request of about 1 ms shows as a sample or two; shorter
  // intervals cost the server more than they tell.
  session.post('Profiler.setSamplingInterval', { interval: 500 });
  session.post('Profiler.start');
  let written = false;
  const write = (): void => {
    if (written) return;
    written = true;
    // The main thread's inspector session answers synchronously, before post() returns.
    session.post('Profiler.stop', (error, result) => {
      if (error === null) {
        writeFileSync(
          join(dir, `server-${process.pid}.cpuprofile`),
          JSON.stringify(result.profile),
        );
      }
    });
  };
  process.on('exit', write);
  let signals = 0;
  process.on('SIGTERM', () => {
    signals += 1;
    if (signals > 1) process.exit(0);
  });
}
