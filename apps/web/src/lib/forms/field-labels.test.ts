import { fieldNames, plainWordingProblems, requestSchemas } from '@torquetrail/contracts';
import { describe, expect, it } from 'vitest';
import { FIELD_LABELS, fieldLabel } from './field-labels';

describe('fieldLabel: the API’s field paths in the forms’ words', () => {
  it('names a field of a list item with the item and its number from 1', () => {
    expect(fieldLabel('parts.0.lot')).toBe('Lot, part 1');
    expect(fieldLabel('exams.0.sites.2.probingDepthMm')).toBe('Probing depth (mm), exam 1, site 3');
    expect(fieldLabel('deliveredOn')).toBe('Delivery date');
    expect(fieldLabel('sites.1')).toBe('Site 2');
  });

  it('has a label, in plain words, for every field any contract can name (walked, not listed)', () => {
    const names = new Set(requestSchemas().flatMap((r) => [...fieldNames(r.schema)]));
    expect(names.size).toBeGreaterThan(50);
    expect([...names].filter((n) => !(n in FIELD_LABELS))).toEqual([]);
    for (const name of names) expect(plainWordingProblems(fieldLabel(name)), name).toEqual([]);
  });
});
