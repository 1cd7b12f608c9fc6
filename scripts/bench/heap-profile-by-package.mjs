// What a request allocates, by package and by function (issue 13, goal 1): a .heapprofile from
// scripts/bench/api-cpu.mjs --profile-kind heap (V8's sampling heap profiler, objects already
// collected included), its sampled bytes added up per package/API feature (as in
// cpu-profile-by-package.mjs) by the function that allocated them, and per function.
// Usage: node scripts/bench/heap-profile-by-package.mjs <file.heapprofile> [--requests N] [--top 25]
import fs from 'node:fs';
import { parseArgs } from 'node:util';
import { packageOf } from './cpu-profile-by-package.mjs';

/** Allocated bytes by package (of the allocating function; a native one takes its caller's) and by function. */
export function aggregateHeap(profile) {
  const byPackage = new Map();
  const byFunction = new Map();
  let total = 0;
  const add = (map, key, bytes) => map.set(key, (map.get(key) ?? 0) + bytes);
  const walk = (node, callerPackage) => {
    const { functionName, url, lineNumber } = node.callFrame;
    const own = packageOf(url);
    const pkg = own ?? (callerPackage ? `${callerPackage} (native)` : functionName || '(native)');
    const bytes = node.selfSize ?? 0;
    if (bytes > 0) {
      total += bytes;
      add(byPackage, pkg, bytes);
      add(byFunction, `${functionName || '(anonymous)'} [${own ?? pkg}${url ? `:${lineNumber + 1}` : ''}]`, bytes);
    }
    for (const child of node.children ?? []) walk(child, own ?? callerPackage);
  };
  walk(profile.head, null);
  const sorted = (map) => [...map].sort((a, b) => b[1] - a[1]);
  return { totalBytes: total, packages: sorted(byPackage), functions: sorted(byFunction) };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { values, positionals } = parseArgs({
    allowPositionals: true,
    options: { top: { type: 'string', default: '25' }, requests: { type: 'string' } },
  });
  const result = aggregateHeap(JSON.parse(fs.readFileSync(positionals[0], 'utf8')));
  const requests = values.requests ? Number(values.requests) : null;
  const kb = (bytes) =>
    requests ? `${(bytes / 1024 / requests).toFixed(1)} KB/request` : `${(bytes / 1024).toFixed(0)} KB`;
  console.log(
    `${positionals[0]}: ${(result.totalBytes / 1048576).toFixed(1)} MB sampled${requests ? `, ${kb(result.totalBytes)}` : ''}`,
  );
  for (const [title, rows] of [
    ['by package / API feature', result.packages],
    ['by function', result.functions],
  ]) {
    console.log(`\nAllocated, ${String(title)}\n| # | what | allocated | share |\n|---|---|---|---|`);
    rows
      .slice(0, Number(values.top))
      .forEach(([key, bytes], i) =>
        console.log(`| ${i + 1} | ${key} | ${kb(bytes)} | ${((100 * bytes) / result.totalBytes).toFixed(1)} % |`),
      );
  }
}
