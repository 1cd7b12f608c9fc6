// The impression form's scan-body check: the planner's rule (a digital impression's scan body is of
// the site's platform, with its lot where the catalogue asks) run on the form's body, each Finding
// at the field it concerns. The rule is [common practice] (docs/clinical-rules.md, scan bodies):
// a scan body of another connection puts the lab's restoration on the wrong interface.
import type { CatalogueReply } from '@torquetrail/contracts';
import { describe, expect, it } from 'vitest';
import { scanBodyIssues, scanBodyOptions } from './scan-body-choice';

const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
const part = (n: number, kind: 'scan-body' | 'abutment', requiresLot: boolean) => ({
  id: id(n),
  platformId: id(90 + n),
  kind,
  name: `Part ${n}`,
  referenceCode: `P-${n}`,
  engaging: true,
  angleDeg: null,
  collarHeightMm: null,
  tray: null,
  torqueSpecNcm: null,
  tolerancePct: 10,
  requiresLot,
  inUse: false,
  version: 1,
  versionedAt: '2026-01-01T00:00:00.000Z',
});
const platform = (n: number, name: string, components: ReturnType<typeof part>[]) => ({
  id: id(90 + n),
  systemId: id(80),
  name,
  diameterMm: 4,
  connection: 'internal-hex' as const,
  platformShift: false,
  components,
});
// An invented system with two platforms, each with a scan body; one abutment that is no scan body.
const catalogue = {
  caution: 'Check the manufacturer',
  systems: [
    {
      id: id(80),
      name: 'Invented system',
      manufacturer: 'Invented maker',
      gtins: [],
      platforms: [
        platform(1, 'Narrow', [part(1, 'scan-body', true), part(3, 'abutment', false)]),
        platform(2, 'Regular', [part(2, 'scan-body', false)]),
      ],
    },
  ],
} as unknown as CatalogueReply;
const sites = [
  { siteId: id(11), fdi: 35, systemName: 'Invented system', platformName: 'Narrow' },
  { siteId: id(12), fdi: 36, systemName: 'Invented system', platformName: 'Regular' },
];
const options = scanBodyOptions(catalogue);

describe('scan bodies offered and checked in the impression form', () => {
  it('offers only the scan bodies of the catalogue, each with its platform', () => {
    expect(options.map((o) => [o.id, o.platformName])).toEqual([
      [id(1), 'Narrow'],
      [id(2), 'Regular'],
    ]);
  });

  it('finds nothing when each site has its own platform’s scan body with the lot asked for', () => {
    const body = {
      method: 'digital',
      scanBodies: [
        { siteId: id(11), componentId: id(1), lot: 'L1' },
        { siteId: id(12), componentId: id(2), lot: null },
      ],
    };
    expect(scanBodyIssues(body, sites, options)).toEqual([]);
  });

  it('names a scan body of another platform beside its site, and a missing lot beside the lot', () => {
    const body = {
      method: 'digital',
      scanBodies: [
        { siteId: id(11), componentId: id(1), lot: null },
        { siteId: id(12), componentId: id(1), lot: 'L2' },
      ],
    };
    const issues = scanBodyIssues(body, sites, options);
    expect(issues).toContainEqual({ path: ['scanBodies', 0, 'lot'], message: expect.stringMatching(/lot .* 35/) });
    expect(issues).toContainEqual({
      path: ['scanBodies', 1, 'componentId'],
      message: expect.stringMatching(/Narrow platform; the implant at site 36 is Regular/),
    });
    expect(issues).toHaveLength(2);
  });

  it('checks nothing for an analog impression (its copings come from the plan)', () => {
    const body = { method: 'analog', scanBodies: [] };
    expect(scanBodyIssues(body, sites, options)).toEqual([]);
  });
});
