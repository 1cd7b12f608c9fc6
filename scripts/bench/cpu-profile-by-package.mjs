// Where a .cpuprofile's CPU goes, by package (issue 13, goal 1; docs/performance.md). A flat list of
// the hottest functions hides a cost spread over many small functions of one library; this adds
// them up per package or API feature folder:
//   1. self time by package: node_modules/<pkg>, api:<feature> (apps/api/dist/<feature>/),
//      @torquetrail/<pkg>, node:<module>, (garbage collector); a native frame (no script, e.g.
//      `writev`) counts for the package that called it, marked "(native <name>)";
//   2. inclusive time of the top frames: for every function, package and API feature, the samples
//      with it anywhere on the stack (each counted once however deep it recurses), so a
//      library's whole cost shows however many small functions it spreads it over.
// (program) and (idle) are left out of the shares: they are not the process's JavaScript.
// Usage: node scripts/bench/cpu-profile-by-package.mjs <file.cpuprofile> [--top 25] [--requests N] [--json out.json]
import fs from 'node:fs';
import { parseArgs } from 'node:util';

const EXCLUDED = new Set(['(program)', '(idle)', '(root)']);
const NATIVE = / \(native [^)]*\)$/;

/** The package or feature a script URL belongs to. */
export function packageOf(url) {
  if (!url) return null;
  if (url.startsWith('node:')) return `node:${url.slice(5).split('/')[0]}`;
  const modules = url.lastIndexOf('/node_modules/');
  if (modules !== -1) {
    const [first, second] = url.slice(modules + '/node_modules/'.length).split('/');
    // Workspace packages are linked into node_modules; their real path is packages/<name>/dist.
    return first.startsWith('@') ? `${first}/${second}` : first;
  }
  const api = /\/apps\/api\/dist\/([^/]+)\//.exec(url);
  if (api) return `api:${api[1]}`;
  if (/\/apps\/api\/dist\/[^/]+\.js$/.test(url)) return 'api:(root)';
  const workspace = /\/packages\/([^/]+)\/dist\//.exec(url);
  if (workspace) return `@torquetrail/${workspace[1]}`;
  if (/\/scripts\//.test(url)) return 'bench scripts';
  return url.replace(/^file:\/\//, '');
}

/** Self and inclusive milliseconds by package, feature and function. */
export function aggregate(profile) {
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const parent = new Map();
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  // Each node's own category (its script's package), native frames taking their caller's.
  const category = new Map();
  const categoryOf = (id) => {
    if (category.has(id)) return category.get(id);
    const node = byId.get(id);
    const name = node.callFrame.functionName;
    let value;
    if (name === '(garbage collector)') value = '(garbage collector)';
    else if (EXCLUDED.has(name)) value = name;
    else {
      const own = packageOf(node.callFrame.url);
      if (own) value = own;
      else {
        const up = parent.get(id);
        const callers = up === undefined ? '(native)' : categoryOf(up).replace(NATIVE, '');
        // Named: a system call such as `writev` is wall-clock time on a loaded machine, not CPU.
        value = EXCLUDED.has(callers) ? `(native ${name})` : `${callers} (native ${name || 'code'})`;
      }
    }
    category.set(id, value);
    return value;
  };
  const fnKey = (node) => {
    const { functionName, url, lineNumber } = node.callFrame;
    const where = packageOf(url) ?? categoryOf(node.id);
    return `${functionName || '(anonymous)'} [${where}${url ? `:${lineNumber + 1}` : ''}]`;
  };
  const self = new Map();
  const inclusiveFn = new Map();
  const inclusivePkg = new Map();
  let total = 0;
  let excluded = 0;
  const add = (map, key, ms) => map.set(key, (map.get(key) ?? 0) + ms);
  const { samples, timeDeltas } = profile;
  for (let i = 0; i < samples.length; i += 1) {
    // A sample's time is the gap to the next sample (the last one has none: 0).
    const ms = (timeDeltas[i + 1] ?? 0) / 1000;
    const leaf = samples[i];
    const leafCategory = categoryOf(leaf);
    if (EXCLUDED.has(leafCategory)) {
      excluded += ms;
      continue;
    }
    total += ms;
    add(self, leafCategory, ms);
    const fns = new Set();
    const pkgs = new Set();
    for (let id = leaf; id !== undefined; id = parent.get(id)) {
      const node = byId.get(id);
      if (EXCLUDED.has(node.callFrame.functionName)) continue;
      fns.add(fnKey(node));
      pkgs.add(categoryOf(id).replace(NATIVE, ''));
    }
    for (const f of fns) add(inclusiveFn, f, ms);
    for (const p of pkgs) add(inclusivePkg, p, ms);
  }
  const sorted = (map) => [...map].sort((a, b) => b[1] - a[1]);
  return {
    totalMs: total,
    excludedMs: excluded,
    self: sorted(self),
    inclusive: sorted(inclusivePkg),
    functions: sorted(inclusiveFn),
  };
}

function table(title, rows, totalMs, requests, top) {
  const lines = [`\n${title}`, `| # | what | ms | share | µs/request |`, '|---|---|---|---|---|'];
  rows.slice(0, top).forEach(([key, ms], i) => {
    const perRequest = requests ? ((ms * 1000) / requests).toFixed(0) : '–';
    lines.push(`| ${i + 1} | ${key} | ${ms.toFixed(0)} | ${((100 * ms) / totalMs).toFixed(1)} % | ${perRequest} |`);
  });
  return lines.join('\n');
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { values, positionals } = parseArgs({
    allowPositionals: true,
    options: { top: { type: 'string', default: '25' }, requests: { type: 'string' }, json: { type: 'string' } },
  });
  if (positionals.length !== 1)
    throw new Error('usage: cpu-profile-by-package.mjs <file.cpuprofile> [--top N] [--requests N]');
  const result = aggregate(JSON.parse(fs.readFileSync(positionals[0], 'utf8')));
  const top = Number(values.top);
  const requests = values.requests ? Number(values.requests) : null;
  console.log(
    `${positionals[0]}: ${result.totalMs.toFixed(0)} ms of samples counted` +
      ` (${result.excludedMs.toFixed(0)} ms of (program)/(idle) left out)` +
      (requests ? `, ${requests} requests: ${(result.totalMs / requests).toFixed(2)} ms/request` : ''),
  );
  console.log(table('Self time by package / API feature', result.self, result.totalMs, requests, top));
  console.log(
    table('Inclusive time by package / API feature (on the stack)', result.inclusive, result.totalMs, requests, top),
  );
  console.log(table('Inclusive time of the top frames (functions)', result.functions, result.totalMs, requests, top));
  if (values.json) fs.writeFileSync(values.json, JSON.stringify({ ...result, requests }, null, 1));
}
