// Builders of the demo scenario's records (patients, sites, placements, parts with their torque,
// restorations), shared by the scenario and the feature seeds that add patients of their own.
import type {
  ImpressionCopingKind,
  InterfaceKind,
  LoadingProtocol,
  Material,
  RestorationKind,
  Retention,
  SiteStatus,
  TorqueReason,
} from '@torquetrail/contracts';
import { parseUdi, RULES_VERSION, torqueVerdict } from '@torquetrail/domain';
import { eq } from 'drizzle-orm';
import type { Tx } from '../db/database.js';
import { learnSystemGtin } from '../db/system-gtins.js';
import {
  componentInstances,
  components,
  implantSites,
  patients,
  placements,
  restorationSites,
  restorations,
  torqueEvents,
} from '../db/schema/index.js';
import type { CatalogueIndex } from './demo-catalogue.js';

export const at = (date: string, time = '10:00') => new Date(`${date}T${time}:00Z`);
export const birthDate = (today: string, age: number, monthDay: string) =>
  `${Number(today.slice(0, 4)) - age - (today.slice(5) < monthDay ? 1 : 0)}-${monthDay}`;

export interface Ctx {
  tx: Tx;
  practiceId: string;
  catalogue: CatalogueIndex;
  userIds: Map<string, string>;
  wrenchIds: string[];
}

/** An invented GS1 UDI (GTIN under the GS1 demonstration prefix 950) on the label of Harold's implants. */
export const HAROLD_IMPLANT_UDI = '(01)09506012345012(17)170228(10)SCN4310-12A07';

export async function addSite(ctx: Ctx, patientId: string, fdi: number, status: SiteStatus, endedOn?: string) {
  const [site] = await ctx.tx
    .insert(implantSites)
    .values({ practiceId: ctx.practiceId, patientId, fdi, status, endedOn })
    .returning({ id: implantSites.id });
  return site.id;
}

export async function place(
  ctx: Ctx,
  p: {
    patientId: string;
    siteId: string;
    platform: string;
    placedOn: string;
    lengthMm: number;
    lot: string;
    /** The UDI read from the implant's label, when it was scanned. */
    udi?: string;
    insertionTorqueNcm: number;
    isq: number;
    surgeon?: 'imbert' | 'former';
    axis?: [number, number, number];
    loading?: LoadingProtocol;
  },
) {
  const imbert = p.surgeon !== 'former';
  const platformId = ctx.catalogue.get(p.platform)!.platformId;
  const gtin = p.udi ? parseUdi(p.udi).gtin : null;
  await ctx.tx.insert(placements).values({
    practiceId: ctx.practiceId,
    patientId: p.patientId,
    siteId: p.siteId,
    platformId,
    placedOn: p.placedOn,
    surgeonUserId: imbert ? ctx.userIds.get('rafael.imbert@northgate.example')! : null,
    surgeonName: imbert ? 'Dr Rafael Imbert (Northgate Oral Surgery)' : 'Dr Selma Voss (former associate)',
    lengthMm: p.lengthMm,
    lot: p.lot,
    udi: p.udi,
    gtin,
    insertionTorqueNcm: p.insertionTorqueNcm,
    stabilityIsq: p.isq,
    loadingProtocol: p.loading ?? 'conventional',
    axisX: p.axis?.[0],
    axisY: p.axis?.[1],
    axisZ: p.axis?.[2],
    recordedBy: imbert
      ? ctx.userIds.get('rafael.imbert@northgate.example')!
      : ctx.userIds.get('ines.calloway@larkspur.example')!,
    recordedAt: at(p.placedOn, '16:00'),
  });
  await learnSystemGtin(ctx.tx, { practiceId: ctx.practiceId, platformId, gtin });
}

/** Installs a part and logs its torque history: [date, time, applied N·cm, reason]. */
export async function install(
  ctx: Ctx,
  p: {
    patientId: string;
    siteId: string;
    restorationId?: string;
    platform: string;
    part: string;
    lot: string;
    installedOn: string;
    torque?: [string, string, number, TorqueReason][];
  },
) {
  const componentId = ctx.catalogue.get(p.platform)!.parts.get(p.part)!;
  const [instance] = await ctx.tx
    .insert(componentInstances)
    .values({
      practiceId: ctx.practiceId,
      patientId: p.patientId,
      siteId: p.siteId,
      restorationId: p.restorationId,
      componentId,
      lot: p.lot,
      installedOn: p.installedOn,
      recordedBy: ctx.userIds.get('ines.calloway@larkspur.example')!,
      recordedAt: at(p.installedOn, '12:00'),
    })
    .returning({ id: componentInstances.id });
  const [spec] = await ctx.tx
    .select({ torqueSpecNcm: components.torqueSpecNcm, tolerancePct: components.tolerancePct })
    .from(components)
    .where(eq(components.id, componentId));
  for (const [date, time, appliedNcm, reason] of p.torque ?? []) {
    const specNcm = spec.torqueSpecNcm!;
    await ctx.tx.insert(torqueEvents).values({
      practiceId: ctx.practiceId,
      patientId: p.patientId,
      componentInstanceId: instance.id,
      appliedNcm,
      specNcm,
      tolerancePct: spec.tolerancePct,
      verdict: torqueVerdict({ appliedNcm, specNcm, tolerancePct: spec.tolerancePct }),
      rulesVersion: RULES_VERSION,
      reason,
      wrenchId: ctx.wrenchIds[0],
      performedAt: at(date, time),
      recordedBy: ctx.userIds.get('ines.calloway@larkspur.example')!,
      recordedAt: at(date, time),
    });
  }
  return instance.id;
}

/** Seats a screw: initial tightening, then the re-torque about ten minutes later (Siamos et al. 2002). */
export const seated = (date: string, ncm: number): [string, string, number, TorqueReason][] => [
  [date, '10:00', ncm, 'initial-seating'],
  [date, '10:11', ncm, 're-torque-after-settling'],
];

export async function restoration(
  ctx: Ctx,
  r: {
    patientId: string;
    kind: RestorationKind;
    retention: Retention;
    material: Material;
    shade: string;
    impressionOn: string;
    deliveredOn: string;
    copingsSplinted?: boolean;
    /** A provisional: the day its definitive restoration is planned. */
    plannedReplacementOn?: string;
    notes?: string;
    sites: {
      siteId: string;
      interface: InterfaceKind;
      coping: ImpressionCopingKind;
      muAngle?: number;
      spaceMm?: number;
    }[];
  },
) {
  const [row] = await ctx.tx
    .insert(restorations)
    .values({
      practiceId: ctx.practiceId,
      patientId: r.patientId,
      kind: r.kind,
      retention: r.retention,
      material: r.material,
      shade: r.shade,
      status: 'delivered',
      copingsSplinted: r.copingsSplinted ?? false,
      impressionTakenOn: r.impressionOn,
      deliveredOn: r.deliveredOn,
      provisional: r.plannedReplacementOn !== undefined,
      plannedReplacementOn: r.plannedReplacementOn,
      notes: r.notes,
      plannedBy: ctx.userIds.get('ines.calloway@larkspur.example')!,
      createdAt: at(r.impressionOn, '09:00'),
    })
    .returning({ id: restorations.id });
  await ctx.tx.insert(restorationSites).values(
    r.sites.map((s) => ({
      practiceId: ctx.practiceId,
      restorationId: row.id,
      siteId: s.siteId,
      interface: s.interface,
      impressionCoping: s.coping,
      multiUnitAngleDeg: s.muAngle,
      restorativeSpaceMm: s.spaceMm,
    })),
  );
  return row.id;
}

export async function addPatient(
  tx: Tx,
  practiceId: string,
  p: typeof patients.$inferInsert extends infer T ? Omit<T, 'practiceId'> : never,
) {
  // The demo's patients with an e-mail address agreed to reminders when they were registered.
  const consent = p.email ? { emailReminderConsent: true, emailReminderConsentOn: '2023-09-04' } : {};
  const [row] = await tx
    .insert(patients)
    .values({ riskFactorsRecordedOn: '2025-10-06', ...consent, ...p, practiceId })
    .returning({ id: patients.id });
  return row.id;
}
