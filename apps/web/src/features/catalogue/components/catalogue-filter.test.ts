import type { CatalogueComponent, CatalogueSystem } from '@torquetrail/contracts';
import { describe, expect, it } from 'vitest';
import { filterCatalogue } from './catalogue-filter';

const part = (id: string, name: string, kind: CatalogueComponent['kind'], platformId: string): CatalogueComponent => ({
  id,
  platformId,
  kind,
  name,
  referenceCode: id.toUpperCase(),
  engaging: null,
  angleDeg: null,
  collarHeightMm: null,
  maxDivergenceDeg: null,
  retentionLabel: null,
  retentionN: null,
  tray: null,
  copingLevel: null,
  torqueSpecNcm: 35,
  tolerancePct: 10,
  requiresLot: true,
  inUse: false,
  version: 1,
  versionedAt: '2026-01-01T00:00:00.000Z',
});
const systems: CatalogueSystem[] = [
  {
    id: 's1',
    name: 'Alder',
    manufacturer: 'Fenwick Dental',
    gtins: [],
    platforms: [
      {
        id: 'p1',
        systemId: 's1',
        name: 'Alder RP',
        diameterMm: 4.3,
        connection: 'internal-conical',
        platformShift: true,
        components: [
          part('a1', 'Abutment screw RP', 'abutment-screw', 'p1'),
          part('a2', 'Healing cap RP', 'healing-abutment', 'p1'),
        ],
      },
      {
        id: 'p2',
        systemId: 's1',
        name: 'Alder NP',
        diameterMm: 3.5,
        connection: 'internal-conical',
        platformShift: true,
        components: [],
      },
    ],
  },
  {
    id: 's2',
    name: 'Birch',
    manufacturer: 'Orwell',
    gtins: [],
    platforms: [
      {
        id: 'p3',
        systemId: 's2',
        name: 'Birch 4.1',
        diameterMm: 4.1,
        connection: 'external-hex',
        platformShift: false,
        components: [part('b1', 'Abutment screw 4.1', 'abutment-screw', 'p3')],
      },
    ],
  },
];

describe('catalogue search, grouped by system and platform', () => {
  it('an empty search keeps everything, empty platforms included', () => {
    const r = filterCatalogue(systems, '  ');
    expect(r.systems.map((s) => s.platforms.map((p) => p.id))).toEqual([['p1', 'p2'], ['p3']]);
    expect(r.parts).toBe(3);
  });
  it('every word must match the part or its platform and system', () => {
    const r = filterCatalogue(systems, 'screw alder');
    expect(r.systems.map((s) => [s.id, s.platforms.map((p) => [p.id, p.components.map((c) => c.id)])])).toEqual([
      ['s1', [['p1', ['a1']]]],
    ]);
    expect(r.parts).toBe(1);
  });
  it('matches reference codes, kinds in words and the manufacturer, without regard to case', () => {
    expect(filterCatalogue(systems, 'b1').systems.map((s) => s.id)).toEqual(['s2']);
    expect(filterCatalogue(systems, 'HEALING').parts).toBe(1);
    expect(filterCatalogue(systems, 'orwell').parts).toBe(1);
  });
  it('a platform found by name is shown even without parts; nothing found → no systems', () => {
    expect(filterCatalogue(systems, 'alder np').systems[0].platforms.map((p) => p.id)).toEqual(['p2']);
    expect(filterCatalogue(systems, 'zygomatic')).toEqual({ systems: [], parts: 0 });
  });
});
