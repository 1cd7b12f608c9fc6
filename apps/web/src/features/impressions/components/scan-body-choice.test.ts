// The impression form's scan-body check: the planner's rule (a digital impression's scan body is of
// the site's platform, with its lot where the catalogue asks) run on the form's body, each Finding
// at the field it concerns. The rule is [common practice] (docs/clinical-rules.md, scan bodies):
// a scan body of another connection puts the lab's restoration on the wrong interface.
import type { CatalogueReply } from '@torquetrail/contracts';
import { describe, expect, it } from 'vitest';
import { scanBodyIssues, scanBodyOptions, suitsSite } from './scan-body-choice';

const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
const part = (
  n: number,
  kind: 'scan-body' | 'abutment',
  requiresLot: boolean,
  copingLevel: 'implant' | 'multi-unit' | null = kind === 'scan-body' ? 'implant' : null,
) => ({
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
  copingLevel,
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
        platform(2, 'Regular', [part(2, 'scan-body', false), part(4, 'scan-body', true, 'multi-unit')]),
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
      [id(4), 'Regular'],
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

  // Level rule [common practice] (part-fit.ts): work screwed to multi-unit abutments is recorded on
  // them, so its scan bodies are multi-unit level; any other restoration's are implant level.
  it('worked case: a multi-unit scan body at 36 of a crown screwed to the implant is named beside the site', () => {
    const body = {
      method: 'digital',
      scanBodies: [
        { siteId: id(11), componentId: id(1), lot: 'L1' },
        { siteId: id(12), componentId: id(4), lot: 'L4' },
      ],
    };
    expect(scanBodyIssues(body, sites, options, 'screw-to-implant')).toEqual([
      {
        path: ['scanBodies', 1, 'componentId'],
        message: expect.stringMatching(
          /^Site 36: Part 4 works on a multi-unit abutment, but this restoration has none/,
        ),
      },
    ]);
    // Screwed to multi-units: the implant-level one at 35 is the error, the multi-unit one passes.
    expect(scanBodyIssues(body, sites, options, 'screw-to-multi-unit')).toEqual([
      {
        path: ['scanBodies', 0, 'componentId'],
        message: expect.stringMatching(
          /^Site 35: Part 1 works at implant level, but this restoration is screwed to multi-unit/,
        ),
      },
    ]);
    // Without the retention the level is not judged (the API still is).
    expect(scanBodyIssues(body, sites, options)).toEqual([]);
  });

  it('offers first the scan bodies of the site platform and of the level the restoration needs', () => {
    const regular = sites[1];
    const suiting = (retention?: 'screw-to-implant' | 'screw-to-multi-unit') =>
      options.filter((o) => suitsSite(o, regular, retention)).map((o) => o.id);
    expect(suiting('screw-to-implant')).toEqual([id(2)]);
    expect(suiting('screw-to-multi-unit')).toEqual([id(4)]);
    expect(suiting()).toEqual([id(2), id(4)]);
  });

  it('checks nothing for an analog impression (its copings come from the plan)', () => {
    const body = { method: 'analog', scanBodies: [] };
    expect(scanBodyIssues(body, sites, options)).toEqual([]);
  });
});
