// `npm run lint`: the house rules, checked. Four checks, each named with what it guards:
//   code      oxlint with type-aware rules (.oxlintrc.json)              — docs/adr/0003
//   format    oxfmt --check (.oxfmtrc.json, .editorconfig)               — docs/adr/0003
//   bounds    dependency-cruiser (.dependency-cruiser.cjs)               — docs/adr/0005
//   unused    knip: unused files, exports and dependencies (knip.json)   — docs/adr/0005
// `npm run lint -- code bounds` runs only the named checks. `npm test` runs them all and counts
// each as one result. Exits non-zero when any check fails.
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { repoRoot } from './lib/config.mjs';
import { ensureBoundaryTool } from './lib/bootstrap.mjs';
import { run } from './lib/proc.mjs';

const bin = (name) => path.join(repoRoot, 'node_modules', '.bin', name);

export const lintChecks = {
  code: () => run(bin('oxlint'), ['--type-aware', '--deny-warnings', '--format', 'unix'], { cwd: repoRoot }),
  format: () => run(bin('oxfmt'), ['--check'], { cwd: repoRoot }),
  bounds: async () => {
    const depcruise = await ensureBoundaryTool();
    await run(
      depcruise,
      ['--config', '.dependency-cruiser.cjs', '--output-type', 'err', 'apps', 'packages', 'scripts', 'minio-local'],
      { cwd: repoRoot },
    );
  },
  unused: () => run(bin('knip'), ['--no-progress'], { cwd: repoRoot }),
};

/** Runs the named checks one after another; returns [{ name, ok }]. */
export async function runLint(names = Object.keys(lintChecks)) {
  const results = [];
  for (const name of names) {
    console.log(`\n[lint] ${name} …`);
    try {
      await lintChecks[name]();
      results.push({ name, ok: true });
    } catch (error) {
      console.log(`[lint] ${name} failed: ${error.message}`);
      results.push({ name, ok: false });
    }
  }
  console.log(`\n[lint] ${results.map((r) => `${r.name} ${r.ok ? 'ok' : 'FAILED'}`).join(', ')}`);
  return results;
}

if (import.meta.url === pathToFileURL(process.argv[1]).href) {
  const names = process.argv.slice(2);
  const unknown = names.filter((n) => !(n in lintChecks));
  if (unknown.length > 0) {
    console.error(`unknown check: ${unknown.join(', ')} (known: ${Object.keys(lintChecks).join(', ')})`);
    process.exit(2);
  }
  const results = await runLint(names.length > 0 ? names : undefined);
  process.exit(results.every((r) => r.ok) ? 0 : 1);
}
