import { describe, expect, it } from 'vitest';
import { sharedBuffersOf } from './plan-buffers.mjs';

// Plans in PostgreSQL's EXPLAIN (ANALYZE, BUFFERS) text format (shapes as the desk's statements print them).
const plan = (top, details, buffers, child) =>
  [
    `${top}  (cost=1.00..2.00 rows=1 width=4) (actual time=0.1..0.2 rows=1 loops=1)`,
    ...details.map((d) => `  ${d}`),
    `  Buffers: ${buffers}`,
    `  ->  ${child}  (cost=0.29..1.00 rows=1 width=0) (actual time=0.01..0.1 rows=1 loops=1)`,
    '        Buffers: shared hit=7',
  ].join('\n');

describe('sharedBuffersOf', () => {
  it("adds each statement's top node, with or without detail lines before its Buffers line", () => {
    const text = [
      '-- select …',
      plan('Aggregate', [], 'shared hit=49', 'Index Only Scan using x on y'),
      '',
      '-- with late as (…)',
      plan('Merge Full Join', ['Merge Cond: (rp.patient_id = ro.patient_id)'], 'shared hit=225 read=3', 'Sort'),
      'Planning Time: 0.5 ms',
      'Execution Time: 0.6 ms',
    ].join('\n');
    expect(sharedBuffersOf(text)).toBe(49 + 225 + 3);
  });

  it("never counts a child's Buffers line for a top node without one", () => {
    const text = [
      'Result  (cost=0.00..0.01 rows=1 width=4) (actual time=0.001..0.001 rows=1 loops=1)',
      '  ->  Seq Scan on t  (cost=0.00..1.00 rows=1 width=4) (actual time=0.01..0.1 rows=1 loops=1)',
      '        Buffers: shared hit=7',
    ].join('\n');
    expect(sharedBuffersOf(text)).toBe(0);
  });
});
