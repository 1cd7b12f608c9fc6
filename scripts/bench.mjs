// `npm run bench`: the benchmarks, one after another. Each prints its own timings; none asserts.
// Needs a prior `npm run build` (the benchmarks use the API's dist/).
import path from 'node:path';
import { repoRoot } from './lib/config.mjs';
import { run } from './lib/proc.mjs';

const benches = [
  'scripts/bench-recall-desk.mjs',
  'scripts/bench-audit-reads.mjs',
  'scripts/bench-radiograph-upload.mjs',
  'scripts/bench-import.mjs',
];
for (const bench of benches) {
  console.log(`\n== ${bench}`);
  await run(process.execPath, [path.join(repoRoot, bench), ...process.argv.slice(2)], {
    cwd: repoRoot,
    env: process.env,
  });
}
