import type { ArchSite } from '@torquetrail/contracts';
import { describe, expect, it } from 'vitest';
import { cellContents, describeCell } from './cell-description';

const site = (over: Partial<ArchSite>): ArchSite => ({
  id: '00000000-0000-4000-8000-000000000201',
  fdi: 36,
  status: 'restored',
  maintenanceStatus: 'health',
  lastExamDate: '2026-03-12',
  systemName: null,
  ...over,
});

describe('describeCell', () => {
  it('names each kind of cell, numbers in the chosen system', () => {
    expect(describeCell(36, 'fdi', { type: 'site', site: site({}) })).toBe(
      '36, implant, peri-implant health, last exam 12 March 2026',
    );
    expect(describeCell(36, 'universal', { type: 'site', site: site({}) })).toMatch(/^19, implant/);
    expect(
      describeCell(24, 'fdi', {
        type: 'site',
        site: site({ fdi: 24, status: 'planned', maintenanceStatus: 'not-examined', lastExamDate: null }),
      }),
    ).toBe('24, implant planned, not yet examined');
    expect(describeCell(21, 'fdi', { type: 'natural' })).toBe('21, natural tooth');
    expect(describeCell(46, 'fdi', { type: 'missing' })).toBe('46, missing tooth');
  });
});

describe('cellContents', () => {
  it('draws the current site where a position has several, else missing or natural', () => {
    const removed = site({ id: '00000000-0000-4000-8000-000000000202', status: 'removed' });
    const current = site({ status: 'placed' });
    const contents = cellContents([36, 46, 21], [removed, current], [46]);
    expect(contents.get(36)).toEqual({ type: 'site', site: current });
    expect(contents.get(46)).toEqual({ type: 'missing' });
    expect(contents.get(21)).toEqual({ type: 'natural' });
  });
});
