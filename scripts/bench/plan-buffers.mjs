// Pages a statement read, from its EXPLAIN (ANALYZE, BUFFERS) text: the Buffers line of each plan's
// top node (its totals include every node below it), summed over the statements of a file. The
// top node's Buffers line comes after its own detail lines ("Merge Cond:", "Sort Key:", …) and
// before its first child ("->"), so it is looked for there, not only on the next line.
const TOP_NODE_BUFFERS =
  /^\S.*\(cost=.*\n(?:[ \t]+(?!->)(?!Buffers:)\S.*\n)*?[ \t]+Buffers: shared hit=(\d+)(?: read=(\d+))?/gm;

/** Shared buffers (hit + read) of every statement's top plan node in an EXPLAIN text. */
export const sharedBuffersOf = (text) =>
  [...text.matchAll(TOP_NODE_BUFFERS)].reduce((sum, m) => sum + Number(m[1]) + Number(m[2] ?? 0), 0);
