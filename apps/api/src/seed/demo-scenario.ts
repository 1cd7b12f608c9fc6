// The demo practice, from shared/design/demo-scenario.md: every clinic, person, system and
// manufacturer is invented. Dates near today (recent placements) are computed from `today`.
import { PATIENT_RECORD_FIELDS, SHARE_SCOPES } from '@torquetrail/contracts';
import { addCalendarDays as addDays } from '@torquetrail/domain';
import type { Tx } from '../db/database.js';
import { hashPassword } from '../auth/password.js';
import {
  patients,
  patientVersions,
  chartNumberSequences,
  patientShares,
  practices,
  implantSites,
  users,
} from '../db/schema/index.js';
import { DEMO_SYSTEMS, seedCatalogue, seedWrenches } from './demo-catalogue.js';
import {
  HAROLD_IMPLANT_UDI,
  addPatient,
  addSite,
  at,
  birthDate,
  install,
  place,
  restoration,
  seated,
  type Ctx,
} from './demo-builders.js';
import { seedOverdenturePatients } from './demo-overdentures.js';

/** Demo only: printed by `npm start` and listed in the README. */
export const DEMO_PASSWORD = 'ledger-demo-2026';

/** @public Printed by scripts/start.mjs (from the built file) beside the demo password. */
export const DEMO_SIGN_INS = [
  {
    role: 'dentist',
    email: 'ines.calloway@larkspur.example',
    name: 'Dr Ines Calloway',
    practice: 'Larkspur Lane Dental',
  },
  {
    role: 'dentist',
    email: 'tomasz.brill@larkspur.example',
    name: 'Dr Tomasz Brill',
    practice: 'Larkspur Lane Dental',
  },
  { role: 'hygienist', email: 'maren.holt@larkspur.example', name: 'Maren Holt', practice: 'Larkspur Lane Dental' },
  { role: 'hygienist', email: 'priya.sandhu@larkspur.example', name: 'Priya Sandhu', practice: 'Larkspur Lane Dental' },
  {
    role: 'practice_admin',
    email: 'odile.park@larkspur.example',
    name: 'Odile Park',
    practice: 'Larkspur Lane Dental',
  },
  {
    role: 'surgeon',
    email: 'rafael.imbert@northgate.example',
    name: 'Dr Rafael Imbert',
    practice: 'Northgate Oral Surgery',
  },
  {
    role: 'dentist',
    email: 'nell.ashdown@quarryhill.example',
    name: 'Dr Nell Ashdown',
    practice: 'Quarry Hill Dental',
  },
] as const;

/**
 * The first version of every seeded patient (their registration, by the practice's first
 * dentist) and each practice's chart-number prefix, going on after the seeded numbers.
 */
async function seedPatientRecords(tx: Tx, registeredBy: Map<string, string>) {
  const rows = await tx.select().from(patients);
  for (const p of rows) {
    const fields = PATIENT_RECORD_FIELDS;
    await tx.insert(patientVersions).values({
      practiceId: p.practiceId,
      patientId: p.id,
      version: 1,
      kind: 'created',
      changes: fields.map((field) => ({ field, before: null, after: p[field] })),
      changedBy: registeredBy.get(p.practiceId)!,
      changedAt: p.createdAt,
    });
  }
  const sequences = new Map<string, { prefix: string; nextNumber: number }>();
  for (const p of rows) {
    const [, prefix, digits] = /^(.*?)(\d+)$/.exec(p.chartNumber)!;
    const next = Number(digits) + 1;
    if (next > (sequences.get(p.practiceId)?.nextNumber ?? 0))
      sequences.set(p.practiceId, { prefix, nextNumber: next });
  }
  await tx.insert(chartNumberSequences).values([...sequences].map(([practiceId, s]) => ({ practiceId, ...s })));
}

export interface SeedSummary {
  practices: number;
  patients: number;
  sites: number;
}

/** Ids of the seeded scenario, for the seeds that add history on top (see demo.ts). */
export interface DemoRefs {
  today: string;
  practiceIds: { larkspur: string; northgate: string; quarry: string };
  /** By e-mail. */
  userIds: Map<string, string>;
  /** By chart number, e.g. 'LL-1001'. */
  patientIds: Map<string, string>;
  /** By `${chartNumber}:${fdi}`, e.g. 'LL-1001:35'. */
  siteIds: Map<string, string>;
}

/** Seeds the whole demo scenario in the caller's transaction. */
export async function seedDemoScenario(tx: Tx, today: string): Promise<{ summary: SeedSummary; refs: DemoRefs }> {
  const [larkspur, northgate, quarry] = await tx
    .insert(practices)
    .values([
      // Invented contact details (an .example address, a phone number from the range kept for drama).
      {
        name: 'Larkspur Lane Dental',
        phone: '+44 20 7946 0123',
        email: 'desk@larkspur-lane.example',
        address: '14 Larkspur Lane, Eastbridge',
      },
      { name: 'Northgate Oral Surgery' },
      { name: 'Quarry Hill Dental' },
    ])
    .returning({ id: practices.id });
  const practiceIdByName = new Map([
    ['Larkspur Lane Dental', larkspur.id],
    ['Northgate Oral Surgery', northgate.id],
    ['Quarry Hill Dental', quarry.id],
  ]);
  const userRows = await tx
    .insert(users)
    .values(
      await Promise.all(
        DEMO_SIGN_INS.map(async (u) => ({
          practiceId: practiceIdByName.get(u.practice)!,
          email: u.email,
          displayName: u.name,
          role: u.role,
          passwordHash: await hashPassword(DEMO_PASSWORD),
        })),
      ),
    )
    .returning({ id: users.id, email: users.email });
  const userIds = new Map(userRows.map((u) => [u.email, u.id]));

  const ctx: Ctx = {
    tx,
    practiceId: larkspur.id,
    catalogue: await seedCatalogue(tx, larkspur.id, DEMO_SYSTEMS),
    userIds,
    wrenchIds: await seedWrenches(tx, larkspur.id, addDays(today, -120)),
  };
  let sites = 0;

  // 1. Harold Whitcombe: three-unit zirconia bridge 35–37 screwed directly to the implants.
  const harold = await addPatient(tx, ctx.practiceId, {
    chartNumber: 'LL-1001',
    givenName: 'Harold',
    familyName: 'Whitcombe',
    birthDate: birthDate(today, 71, '04-17'),
    email: 'harold.whitcombe@mail.example',
    missingTeeth: [18, 28, 36, 38, 48],
  });
  const h35 = await addSite(ctx, harold, 35, 'restored');
  const h37 = await addSite(ctx, harold, 37, 'restored');
  // 36 did not integrate and came out after twelve weeks; the bridge spans the gap. It is the
  // demo's failed implant (the outcomes curve) and shares its lot with 35 and 37 (the lot look-up).
  const h36 = await addSite(ctx, harold, 36, 'failed', '2012-06-05');
  sites += 3;
  await place(ctx, {
    patientId: harold,
    siteId: h36,
    platform: 'SCN-4.3',
    placedOn: '2012-03-14',
    lengthMm: 10,
    lot: 'SCN4310-12A07',
    udi: HAROLD_IMPLANT_UDI,
    insertionTorqueNcm: 20,
    isq: 52,
    axis: [0, 0, 1],
  });
  await place(ctx, {
    patientId: harold,
    siteId: h35,
    platform: 'SCN-4.3',
    placedOn: '2012-03-14',
    lengthMm: 10,
    lot: 'SCN4310-12A07',
    udi: HAROLD_IMPLANT_UDI,
    insertionTorqueNcm: 40,
    isq: 72,
    axis: [0, 0.05, 1],
  });
  await place(ctx, {
    patientId: harold,
    siteId: h37,
    platform: 'SCN-4.3',
    placedOn: '2012-03-14',
    lengthMm: 10,
    lot: 'SCN4310-12A07',
    udi: HAROLD_IMPLANT_UDI,
    insertionTorqueNcm: 35,
    isq: 70,
    axis: [0.1, -0.05, 1],
  });
  const bridge = await restoration(ctx, {
    patientId: harold,
    kind: 'splinted-bridge',
    retention: 'screw-to-implant',
    material: 'zirconia',
    shade: 'A3',
    impressionOn: '2012-07-30',
    deliveredOn: '2012-09-20',
    copingsSplinted: true,
    sites: [h35, h37].map((siteId) => ({
      siteId,
      interface: 'non-engaging' as const,
      coping: 'non-engaging' as const,
      spaceMm: 7,
    })),
  });
  for (const siteId of [h35, h37]) {
    await install(ctx, {
      patientId: harold,
      siteId,
      restorationId: bridge,
      platform: 'SCN-4.3',
      part: 'bridge-screw',
      lot: 'PSI-1209-33',
      installedOn: '2012-09-20',
      torque: [
        ...seated('2012-09-20', 25),
        ['2016-05-10', '09:30', 25, 'loosening-found'],
        ['2016-05-10', '09:41', 25, 're-torque-after-settling'],
        ['2020-11-02', '11:00', 25, 're-torque-at-recall'],
      ],
    });
  }

  // 2. Imogen Farrow: lower full arch on four implants, straight and 30° multi-unit abutments.
  const imogen = await addPatient(tx, ctx.practiceId, {
    chartNumber: 'LL-1002',
    givenName: 'Imogen',
    familyName: 'Farrow',
    birthDate: birthDate(today, 58, '09-02'),
    email: 'imogen.farrow@mail.example',
    smoker: true,
    missingTeeth: [31, 33, 34, 36, 37, 38, 41, 43, 44, 46, 47, 48],
  });
  const farrowSites: { fdi: number; angle: 0 | 30; axis: [number, number, number] }[] = [
    { fdi: 32, angle: 0, axis: [0, 0, 1] },
    { fdi: 42, angle: 0, axis: [0, 0, 1] },
    { fdi: 35, angle: 30, axis: [-0.5, 0, 0.87] },
    { fdi: 45, angle: 30, axis: [0.5, 0, 0.87] },
  ];
  const imogenSiteIds: string[] = [];
  for (const s of farrowSites) {
    const id = await addSite(ctx, imogen, s.fdi, 'restored');
    imogenSiteIds.push(id);
    await place(ctx, {
      patientId: imogen,
      siteId: id,
      platform: 'SCN-4.3',
      placedOn: '2017-11-21',
      lengthMm: s.angle ? 13 : 11.5,
      lot: 'SCN43-17K21',
      insertionTorqueNcm: 45,
      isq: 68,
      axis: s.axis,
      loading: 'immediate',
    });
  }
  sites += 4;
  const arch = await restoration(ctx, {
    patientId: imogen,
    kind: 'full-arch',
    retention: 'screw-to-multi-unit',
    material: 'titanium-composite',
    shade: 'A2',
    impressionOn: '2018-02-26',
    deliveredOn: '2018-04-11',
    sites: farrowSites.map((s, i) => ({
      siteId: imogenSiteIds[i],
      interface: 'non-engaging' as const,
      coping: 'multi-unit' as const,
      muAngle: s.angle,
      spaceMm: 16,
    })),
  });
  for (const [i, s] of farrowSites.entries()) {
    const siteId = imogenSiteIds[i];
    await install(ctx, {
      patientId: imogen,
      siteId,
      restorationId: arch,
      platform: 'SCN-4.3',
      part: s.angle ? 'mua-30' : 'mua-0',
      lot: s.angle ? 'MU30-1711-04' : 'MU0-1711-12',
      installedOn: '2017-11-21',
      torque: seated('2017-11-21', s.angle ? 15 : 35),
    });
    await install(ctx, {
      patientId: imogen,
      siteId,
      restorationId: arch,
      platform: 'SCN-4.3',
      part: 'mua-screw',
      lot: 'PSM-1803-19',
      installedOn: '2018-04-11',
      torque: [...seated('2018-04-11', 15), ['2021-06-15', '10:00', 14, 're-torque-at-recall']],
    });
  }

  // 3. Desmond Okafor: cement-retained crown on a custom engaging abutment at 46.
  const desmond = await addPatient(tx, ctx.practiceId, {
    chartNumber: 'LL-1003',
    givenName: 'Desmond',
    familyName: 'Okafor',
    birthDate: birthDate(today, 46, '01-23'),
    email: 'desmond.okafor@mail.example',
    periodontitisHistory: true,
    missingTeeth: [18, 28],
  });
  const d46 = await addSite(ctx, desmond, 46, 'restored');
  sites += 1;
  await place(ctx, {
    patientId: desmond,
    siteId: d46,
    platform: 'MHX-4.8',
    placedOn: '2014-10-02',
    lengthMm: 8,
    lot: 'MHX488-1409',
    insertionTorqueNcm: 35,
    isq: 66,
    surgeon: 'former',
  });
  const crown = await restoration(ctx, {
    patientId: desmond,
    kind: 'single-crown',
    retention: 'cement-on-abutment',
    material: 'porcelain-fused-to-metal',
    shade: 'A3.5',
    impressionOn: '2015-01-20',
    deliveredOn: '2015-02-18',
    sites: [{ siteId: d46, interface: 'engaging', coping: 'engaging', spaceMm: 8.5 }],
  });
  await install(ctx, {
    patientId: desmond,
    siteId: d46,
    restorationId: crown,
    platform: 'MHX-4.8',
    part: 'custom-abutment',
    lot: 'CA-1502-0088',
    installedOn: '2015-02-18',
  });
  await install(ctx, {
    patientId: desmond,
    siteId: d46,
    restorationId: crown,
    platform: 'MHX-4.8',
    part: 'abutment-screw',
    lot: 'AS-1501-41',
    installedOn: '2015-02-18',
    torque: seated('2015-02-18', 30),
  });

  // 4. Lucía Ferraz: lingual set-screw zirconia crown at 14; 24 planned for placement.
  const lucia = await addPatient(tx, ctx.practiceId, {
    chartNumber: 'LL-1004',
    givenName: 'Lucía',
    familyName: 'Ferraz',
    birthDate: birthDate(today, 39, '06-30'),
    email: 'lucia.ferraz@mail.example',
    missingTeeth: [],
  });
  const l14 = await addSite(ctx, lucia, 14, 'restored');
  await addSite(ctx, lucia, 24, 'planned');
  sites += 2;
  await place(ctx, {
    patientId: lucia,
    siteId: l14,
    platform: 'SCN-3.5',
    placedOn: '2019-11-05',
    lengthMm: 11.5,
    lot: 'SCN3511-19J30',
    insertionTorqueNcm: 35,
    isq: 74,
  });
  const lcrown = await restoration(ctx, {
    patientId: lucia,
    kind: 'single-crown',
    retention: 'lingual-set-screw',
    material: 'zirconia',
    shade: 'B1',
    impressionOn: '2020-02-10',
    deliveredOn: '2020-03-09',
    sites: [{ siteId: l14, interface: 'engaging', coping: 'engaging', spaceMm: 8 }],
  });
  await install(ctx, {
    patientId: lucia,
    siteId: l14,
    restorationId: lcrown,
    platform: 'SCN-3.5',
    part: 'stock-abutment',
    lot: 'SA-2002-310',
    installedOn: '2020-03-09',
  });
  await install(ctx, {
    patientId: lucia,
    siteId: l14,
    restorationId: lcrown,
    platform: 'SCN-3.5',
    part: 'abutment-screw',
    lot: 'AS-2001-77',
    installedOn: '2020-03-09',
    torque: seated('2020-03-09', 25),
  });
  await install(ctx, {
    patientId: lucia,
    siteId: l14,
    restorationId: lcrown,
    platform: 'SCN-3.5',
    part: 'set-screw',
    lot: 'LSS-2001-05',
    installedOn: '2020-03-09',
    torque: [
      ['2020-03-09', '10:30', 10, 'initial-seating'],
      ['2020-03-09', '10:41', 10, 're-torque-after-settling'],
    ],
  });

  // 5. Wendell Achterberg: 15 and 16 placed seven weeks ago, healing abutments on.
  const wendell = await addPatient(tx, ctx.practiceId, {
    chartNumber: 'LL-1005',
    givenName: 'Wendell',
    familyName: 'Achterberg',
    birthDate: birthDate(today, 63, '11-11'),
    email: 'wendell.achterberg@mail.example',
    missingTeeth: [17, 18],
  });
  const placedOn = addDays(today, -49);
  for (const [fdi, axis] of [
    [15, [0.05, 0, 1]],
    [16, [-0.1, 0.02, 1]],
  ] as const) {
    const siteId = await addSite(ctx, wendell, fdi, 'placed');
    await place(ctx, {
      patientId: wendell,
      siteId,
      platform: 'TEX-4.1',
      placedOn,
      lengthMm: 10,
      lot: 'TEX4110-26B',
      insertionTorqueNcm: 35,
      isq: 69,
      axis: [...axis],
    });
    await install(ctx, {
      patientId: wendell,
      siteId,
      platform: 'TEX-4.1',
      part: 'healing',
      lot: 'HA4-2609-14',
      installedOn: placedOn,
    });
  }
  sites += 2;

  // 5b. Overdentures: Beatrix Lindqvist (stud attachments), Otto Ravensworth (bar), Agnes Thornbury (to plan).
  const overdentures = await seedOverdenturePatients(ctx, today);
  sites += overdentures.sites;

  // 5c. Signe Marchetti: 21 placed with immediate loading and a screw-retained provisional crown the
  // same day; the definitive crown was planned sixteen weeks later [common practice: three to four
  // months of healing before the definitive] and is now overdue (the Recall desk's provisionals).
  const signe = await addPatient(tx, ctx.practiceId, {
    chartNumber: 'LL-1009',
    givenName: 'Signe',
    familyName: 'Marchetti',
    birthDate: birthDate(today, 52, '02-21'),
    email: 'signe.marchetti@mail.example',
    missingTeeth: [],
  });
  const s21 = await addSite(ctx, signe, 21, 'restored');
  sites += 1;
  const signePlacedOn = addDays(today, -150);
  await place(ctx, {
    patientId: signe,
    siteId: s21,
    platform: 'SCN-3.5',
    placedOn: signePlacedOn,
    lengthMm: 13,
    lot: 'SCN3513-26C04',
    insertionTorqueNcm: 40,
    isq: 73,
    axis: [0, 0.2, 1],
    loading: 'immediate',
  });
  const provisional = await restoration(ctx, {
    patientId: signe,
    kind: 'single-crown',
    retention: 'screw-to-implant',
    material: 'other',
    shade: 'A2',
    impressionOn: signePlacedOn,
    deliveredOn: signePlacedOn,
    plannedReplacementOn: addDays(signePlacedOn, 112),
    notes: 'Provisional acrylic crown out of occlusion, shaping the emergence profile.',
    sites: [{ siteId: s21, interface: 'engaging', coping: 'engaging', spaceMm: 9 }],
  });
  await install(ctx, {
    patientId: signe,
    siteId: s21,
    restorationId: provisional,
    platform: 'SCN-3.5',
    part: 'bridge-screw',
    lot: 'PSI-2606-12',
    installedOn: signePlacedOn,
    torque: seated(signePlacedOn, 25),
  });

  // Dr Imbert is shared into the patients he placed for.
  const imbertId = userIds.get('rafael.imbert@northgate.example')!;
  const sharedBy = userIds.get('ines.calloway@larkspur.example')!;
  // His live shares open placement and outcomes of every site; an ended and a revoked share of
  // Desmond Okafor show what no longer opens anything.
  const reasons: [string, string][] = [
    [harold, 'Placed 35 and 37; follows the bridge and the bone levels'],
    [imogen, 'Placed the four implants of the lower full arch; follows the recalls'],
    [lucia, 'Referred for the placement at 24'],
    [wendell, 'Placed 15 and 16; records the second-stage visit'],
  ];
  await tx.insert(patientShares).values(
    reasons.map(([patientId, reason]) => ({
      practiceId: ctx.practiceId,
      patientId,
      sharedWithUserId: imbertId,
      sharedByUserId: sharedBy,
      scopes: [...SHARE_SCOPES],
      reason,
      since: at('2024-01-08'),
    })),
  );
  await tx.insert(patientShares).values([
    {
      practiceId: ctx.practiceId,
      patientId: desmond,
      sharedWithUserId: imbertId,
      sharedByUserId: sharedBy,
      scopes: ['outcomes'],
      reason: 'Second opinion on the bone loss at 46',
      since: at('2023-05-02'),
      endsOn: '2023-08-31',
    },
    {
      practiceId: ctx.practiceId,
      patientId: desmond,
      sharedWithUserId: imbertId,
      sharedByUserId: sharedBy,
      scopes: [...SHARE_SCOPES],
      reason: 'Referred for a possible replacement implant at 46',
      since: at('2024-03-11'),
      revokedAt: at('2024-04-02'),
      revokedBy: sharedBy,
      revokeReason: 'The patient chose to keep the present implant under monitoring',
    },
  ]);

  // 6. Quarry Hill Dental: an unrelated practice, never visible to Larkspur Lane.
  const qctx: Ctx = {
    ...ctx,
    practiceId: quarry.id,
    catalogue: await seedCatalogue(tx, quarry.id, [DEMO_SYSTEMS[1]]),
    wrenchIds: await seedWrenches(tx, quarry.id, addDays(today, -200)),
  };
  for (const [chart, given, family, age, fdi] of [
    ['QH-2001', 'Ottilie', 'Marsh', 52, 36],
    ['QH-2002', 'Caspar', 'Lindqvist', 44, 11],
  ] as const) {
    const pid = await addPatient(tx, qctx.practiceId, {
      chartNumber: chart,
      givenName: given,
      familyName: family,
      birthDate: birthDate(today, age, '03-03'),
      missingTeeth: [],
    });
    const siteId = await addSite(qctx, pid, fdi, 'placed');
    await place(qctx, {
      patientId: pid,
      siteId,
      platform: 'MHX-4.1',
      placedOn: '2022-05-17',
      lengthMm: 10,
      lot: 'MHX41-2205',
      insertionTorqueNcm: 35,
      isq: 71,
      surgeon: 'former',
    });
    sites += 1;
  }

  await seedPatientRecords(
    tx,
    new Map([
      [larkspur.id, userIds.get('ines.calloway@larkspur.example')!],
      [quarry.id, userIds.get('nell.ashdown@quarryhill.example')!],
    ]),
  );
  const patientRows = await tx.select({ id: patients.id, chartNumber: patients.chartNumber }).from(patients);
  const siteRows = await tx
    .select({ id: implantSites.id, patientId: implantSites.patientId, fdi: implantSites.fdi })
    .from(implantSites);
  const chartById = new Map(patientRows.map((p) => [p.id, p.chartNumber]));
  const refs: DemoRefs = {
    today,
    practiceIds: { larkspur: larkspur.id, northgate: northgate.id, quarry: quarry.id },
    userIds,
    patientIds: new Map(patientRows.map((p) => [p.chartNumber, p.id])),
    siteIds: new Map(siteRows.map((s) => [`${chartById.get(s.patientId)}:${s.fdi}`, s.id])),
  };
  return { summary: { practices: 3, patients: 8 + overdentures.patients, sites }, refs };
}
