// The demo catalogue: invented implant systems and manufacturers. Torque values follow the
// common-practice defaults of the clinical reference (§6); in a real practice they are what
// the practice enters from each manufacturer's instructions for use, which always rule.
import { randomUUID } from 'node:crypto';
import type { Connection } from '@torquetrail/contracts';
import type { Tx } from '../db/database.js';
import { components, implantSystems, platforms, torqueWrenches, wrenchCalibrations } from '../db/schema/index.js';

type ComponentRow = typeof components.$inferInsert;

export interface SystemSpec {
  name: string;
  manufacturer: string;
  code: string;
  connection: Connection;
  platformShift: boolean;
  diameters: number[];
  /** Abutment screw torque, N·cm (common practice: 20–35, manufacturer-specific). */
  abutmentScrewNcm: number;
}

export const DEMO_SYSTEMS: SystemSpec[] = [
  {
    name: 'Solvra CN',
    manufacturer: 'Solvra Dental',
    code: 'SCN',
    connection: 'internal-conical',
    platformShift: true,
    diameters: [3.5, 4.3, 5.0],
    abutmentScrewNcm: 25,
  },
  {
    name: 'Miravik HX',
    manufacturer: 'Miravik Implant Systems',
    code: 'MHX',
    connection: 'internal-hex',
    platformShift: false,
    diameters: [4.1, 4.8],
    abutmentScrewNcm: 30,
  },
  {
    name: 'Tessely EX',
    manufacturer: 'Tessely Medical',
    code: 'TEX',
    connection: 'external-hex',
    platformShift: false,
    diameters: [4.1],
    abutmentScrewNcm: 32,
  },
];

/** Parts offered on every platform; `key` names a part for the seeded records below. */
function partsFor(
  system: SystemSpec,
  diameter: number,
): (Omit<ComponentRow, 'practiceId' | 'platformId' | 'lineageId'> & { key: string })[] {
  const d = diameter.toFixed(1).replace('.', '');
  const ref = (suffix: string) => `${system.code}-${d}-${suffix}`;
  const screw = system.abutmentScrewNcm;
  return [
    {
      key: 'stock-abutment',
      kind: 'abutment-stock',
      name: 'Straight stock abutment, engaging',
      referenceCode: ref('SA'),
      engaging: true,
      angleDeg: 0,
      collarHeightMm: 2,
      torqueSpecNcm: null,
      tolerancePct: 10,
    },
    {
      key: 'custom-abutment',
      kind: 'abutment-custom',
      name: 'Custom milled abutment, engaging',
      referenceCode: ref('CA'),
      engaging: true,
      angleDeg: null,
      torqueSpecNcm: null,
      tolerancePct: 10,
    },
    {
      key: 'angled-abutment',
      kind: 'abutment-angled',
      name: 'Angled abutment 15°, engaging',
      referenceCode: ref('AA15'),
      engaging: true,
      angleDeg: 15,
      collarHeightMm: 2,
      torqueSpecNcm: null,
      tolerancePct: 10,
    },
    {
      key: 'mua-0',
      kind: 'multi-unit-abutment',
      name: 'Multi-unit abutment 0°, 2 mm collar',
      referenceCode: ref('MU0-2'),
      engaging: false,
      angleDeg: 0,
      collarHeightMm: 2,
      torqueSpecNcm: 35,
      tolerancePct: 10,
    },
    {
      key: 'mua-17',
      kind: 'multi-unit-abutment',
      name: 'Multi-unit abutment 17°, 2.5 mm collar',
      referenceCode: ref('MU17-25'),
      engaging: true,
      angleDeg: 17,
      collarHeightMm: 2.5,
      torqueSpecNcm: 15,
      tolerancePct: 10,
    },
    {
      key: 'mua-30',
      kind: 'multi-unit-abutment',
      name: 'Multi-unit abutment 30°, 3.5 mm collar',
      referenceCode: ref('MU30-35'),
      engaging: true,
      angleDeg: 30,
      collarHeightMm: 3.5,
      torqueSpecNcm: 15,
      tolerancePct: 10,
    },
    {
      key: 'abutment-screw',
      kind: 'abutment-screw',
      name: 'Abutment screw',
      referenceCode: ref('AS'),
      engaging: null,
      torqueSpecNcm: screw,
      tolerancePct: 10,
    },
    {
      key: 'bridge-screw',
      kind: 'prosthetic-screw',
      name: 'Prosthetic screw, implant level',
      referenceCode: ref('PSI'),
      engaging: null,
      torqueSpecNcm: screw,
      tolerancePct: 10,
    },
    {
      key: 'mua-screw',
      kind: 'prosthetic-screw',
      name: 'Prosthetic screw, multi-unit level',
      referenceCode: ref('PSM'),
      engaging: null,
      torqueSpecNcm: 15,
      tolerancePct: 10,
    },
    // Demo value with no source: small lateral set-screws are tightened lightly.
    {
      key: 'set-screw',
      kind: 'set-screw',
      name: 'Lingual set-screw',
      referenceCode: ref('LSS'),
      engaging: null,
      torqueSpecNcm: 10,
      tolerancePct: 10,
    },
    {
      key: 'coping-engaging',
      kind: 'impression-coping',
      name: 'Impression coping, engaging, closed tray',
      referenceCode: ref('ICE-C'),
      engaging: true,
      tray: 'closed',
      copingLevel: 'implant',
      torqueSpecNcm: null,
      tolerancePct: 10,
      requiresLot: false,
    },
    {
      key: 'coping-non-engaging',
      kind: 'impression-coping',
      name: 'Impression coping, non-engaging, open tray',
      referenceCode: ref('ICN-O'),
      engaging: false,
      tray: 'open',
      copingLevel: 'implant',
      torqueSpecNcm: null,
      tolerancePct: 10,
      requiresLot: false,
    },
    {
      key: 'coping-mua',
      kind: 'impression-coping',
      name: 'Multi-unit impression coping, open tray',
      referenceCode: ref('ICM-O'),
      engaging: false,
      tray: 'open',
      copingLevel: 'multi-unit',
      torqueSpecNcm: null,
      tolerancePct: 10,
      requiresLot: false,
    },
    {
      // Screwed on by hand for the intraoral scan and removed after it; its lot is recorded.
      key: 'scan-body',
      kind: 'scan-body',
      name: 'Scan body, hand-tight',
      referenceCode: ref('SB'),
      engaging: true,
      copingLevel: 'implant',
      torqueSpecNcm: null,
      tolerancePct: 10,
      requiresLot: true,
    },
    {
      // Seated on a multi-unit abutment for a digital impression of work screwed to multi-units:
      // it records the abutment, not the implant, so its coping level is what the impression rule
      // reads. Invented demo part; a real practice enters the level and the platform from the
      // manufacturer's instructions for use, which rule (the catalogue shows that caution).
      key: 'scan-body-mua',
      kind: 'scan-body',
      name: 'Multi-unit scan body, hand-tight',
      referenceCode: ref('SBM'),
      engaging: false,
      copingLevel: 'multi-unit',
      torqueSpecNcm: null,
      tolerancePct: 10,
      requiresLot: true,
    },
    {
      key: 'healing',
      kind: 'healing-abutment',
      name: 'Healing abutment 4 mm',
      referenceCode: ref('HA4'),
      engaging: null,
      torqueSpecNcm: null,
      tolerancePct: 10,
    },
    {
      key: 'cover',
      kind: 'cover-screw',
      name: 'Cover screw',
      referenceCode: ref('CS'),
      engaging: null,
      torqueSpecNcm: null,
      tolerancePct: 10,
    },
    // Overdenture parts. Invented demo values: a real practice enters each manufacturer's stated
    // divergence tolerance, collar heights, insert strengths and torque, which always rule.
    {
      key: 'stud-attachment',
      kind: 'attachment-abutment',
      name: 'Stud attachment, 3 mm collar',
      referenceCode: ref('ST3'),
      engaging: false,
      angleDeg: 0,
      collarHeightMm: 3,
      maxDivergenceDeg: 30,
      torqueSpecNcm: screw,
      tolerancePct: 10,
    },
    {
      // Entered without its divergence tolerance: the planner says so rather than guess.
      key: 'stud-attachment-incomplete',
      kind: 'attachment-abutment',
      name: 'Stud attachment, 5 mm collar (tolerance not entered)',
      referenceCode: ref('ST5'),
      engaging: false,
      angleDeg: 0,
      collarHeightMm: 5,
      maxDivergenceDeg: null,
      torqueSpecNcm: screw,
      tolerancePct: 10,
    },
    ...(
      [
        ['insert-light', 'light', 'L', 7],
        ['insert-medium', 'medium', 'M', 13],
        ['insert-strong', 'strong', 'S', 20],
      ] as const
    ).map(([key, label, code, newtons]) => ({
      key,
      kind: 'retentive-insert' as const,
      name: `Retentive insert, ${label}`,
      referenceCode: ref(`RI-${code}`),
      engaging: null,
      retentionLabel: label,
      retentionN: newtons,
      torqueSpecNcm: null,
      tolerancePct: 10,
    })),
    {
      key: 'bar-clip',
      kind: 'bar-clip',
      name: 'Bar clip, round bar',
      referenceCode: ref('BC'),
      engaging: null,
      retentionLabel: 'medium',
      torqueSpecNcm: null,
      tolerancePct: 10,
    },
  ];
}

/** platform id and part ids by `${system code}-${diameter}` then part key. */
export type CatalogueIndex = Map<string, { platformId: string; parts: Map<string, string> }>;

export async function seedCatalogue(tx: Tx, practiceId: string, systems: SystemSpec[]): Promise<CatalogueIndex> {
  const index: CatalogueIndex = new Map();
  for (const system of systems) {
    const [sys] = await tx
      .insert(implantSystems)
      .values({ practiceId, name: system.name, manufacturer: system.manufacturer })
      .returning({ id: implantSystems.id });
    for (const diameter of system.diameters) {
      const [platform] = await tx
        .insert(platforms)
        .values({
          practiceId,
          systemId: sys.id,
          name: `${system.name} ${diameter.toFixed(1)}`,
          diameterMm: diameter,
          connection: system.connection,
          platformShift: system.platformShift,
        })
        .returning({ id: platforms.id });
      const specs = partsFor(system, diameter);
      const inserted = await tx
        .insert(components)
        .values(
          specs.map(({ key: _key, ...spec }) => {
            // A first version is its own lineage (ADR 0006).
            const id = randomUUID();
            return { ...spec, id, lineageId: id, practiceId, platformId: platform.id };
          }),
        )
        .returning({ id: components.id, referenceCode: components.referenceCode });
      const byRef = new Map(inserted.map((c) => [c.referenceCode, c.id]));
      index.set(`${system.code}-${diameter.toFixed(1)}`, {
        platformId: platform.id,
        parts: new Map(specs.map((s) => [s.key, byRef.get(s.referenceCode)!])),
      });
    }
  }
  return index;
}

export async function seedWrenches(tx: Tx, practiceId: string, calibratedOn: string) {
  const wrenches = [
    { label: 'Spring wrench A (surgery 1)', type: 'spring' as const },
    { label: 'Friction wrench B (surgery 2)', type: 'friction' as const },
  ].map((w) => {
    const id = randomUUID();
    return { ...w, id, lineageId: id, practiceId };
  });
  await tx.insert(torqueWrenches).values(wrenches);
  await tx
    .insert(wrenchCalibrations)
    .values(wrenches.map((w) => ({ practiceId, wrenchLineageId: w.id, calibratedOn, note: 'Annual service' })));
  return wrenches.map((w) => w.id);
}
