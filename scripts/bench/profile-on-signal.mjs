// Loaded into the API process by scripts/bench/api-cpu.mjs (`node --import`), never by the app:
// while TT_CPU_PROFILE names a file, SIGWINCH (not one of the signals Nest's shutdown hooks
// close the app on, as SIGUSR2 is) starts V8's sampling profiler and the next SIGWINCH
// writes the .cpuprofile there. Only the load window is profiled (`--cpu-prof` would also count
// the start, whose module loading is several seconds of CPU on this machine).
import fs from 'node:fs';
import { Session } from 'node:inspector';

const file = process.env.TT_CPU_PROFILE;
if (file) {
  const session = new Session();
  session.connect();
  let running = false;
  const post = (method, params = {}) =>
    new Promise((resolve, reject) =>
      session.post(method, params, (error, result) => (error ? reject(error) : resolve(result))),
    );
  // TT_PROFILE_KIND=heap samples allocations instead (every 32 KB allocated, those the GC has
  // already collected included): what the request allocates is what the collector then costs.
  const heap = process.env.TT_PROFILE_KIND === 'heap';
  process.on('SIGWINCH', () => {
    const step = heap
      ? running
        ? post('HeapProfiler.stopSampling').then(({ profile }) => fs.writeFileSync(file, JSON.stringify(profile)))
        : post('HeapProfiler.enable').then(() =>
            post('HeapProfiler.startSampling', {
              samplingInterval: 32768,
              includeObjectsCollectedByMajorGC: true,
              includeObjectsCollectedByMinorGC: true,
            }),
          )
      : running
        ? post('Profiler.stop').then(({ profile }) => fs.writeFileSync(file, JSON.stringify(profile)))
        : post('Profiler.enable')
            .then(() =>
              post('Profiler.setSamplingInterval', { interval: Number(process.env.TT_CPU_PROFILE_US ?? 500) }),
            )
            .then(() => post('Profiler.start'));
    running = !running;
    step.catch((error) => console.error(`[cpu-profile] ${error.message}`));
  });
}
