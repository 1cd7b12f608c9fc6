// `npm run bench`: the benchmarks, one after another. Each prints its own timings; none asserts.
// Needs a prior `npm run build` (the benchmarks use the API's dist/). The Site-file benchmark
// (docs/performance.md) runs by default; `npm run bench -- --all` adds the older, narrower ones.
// Other arguments go to the Site-file benchmark (e.g. `-- --seconds 5 --repeats 3`).
import path from 'node:path';
import { repoRoot } from './lib/config.mjs';
import { run } from './lib/proc.mjs';

const all = process.argv.includes('--all');
const args = process.argv.slice(2).filter((a) => a !== '--all');
/** @type {{ script: string, args: string[] }[]} */
const benches = [
  { script: 'scripts/bench-site-file.mjs', args },
  ...(all
    ? [
        'scripts/bench-recall-desk.mjs',
        'scripts/bench-audit-reads.mjs',
        'scripts/bench-radiograph-upload.mjs',
        'scripts/bench-import.mjs',
        // After the Site file benchmark, which seeds the large practice it reads.
        'scripts/bench/size-sweep.mjs',
      ].map((script) => ({ script, args: [] }))
    : []),
];
for (const bench of benches) {
  console.log(`\n== ${bench.script}`);
  await run(process.execPath, [path.join(repoRoot, bench.script), ...bench.args], {
    cwd: repoRoot,
    env: process.env,
  });
}
