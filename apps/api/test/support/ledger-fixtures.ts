// Fixtures for the ledger tests: extra demo-practice patients with freshly placed implants (one
// per restoration pathway, or one with a part in place), and the catalogue ids the planner needs.
import { and, eq } from 'drizzle-orm';
import type { Database } from '../../src/db/database.js';
import {
  componentInstances,
  components,
  implantSites,
  patients,
  placements,
  platforms,
  practices,
} from '../../src/db/schema/index.js';
import { expect } from 'vitest';
import { signIn, type TestContext } from './test-app.js';

export async function larkspurId(db: Database) {
  const [row] = await db.select({ id: practices.id }).from(practices).where(eq(practices.name, 'Larkspur Lane Dental'));
  return row.id;
}

export async function platformId(db: Database, practiceId: string, name: string) {
  const [row] = await db
    .select({ id: platforms.id })
    .from(platforms)
    .where(and(eq(platforms.practiceId, practiceId), eq(platforms.name, name)));
  if (!row) throw new Error(`no platform ${name}`);
  return row.id;
}

/** Part ids of a platform by reference-code suffix, e.g. 'PSI', 'MU17-25', 'ICN-O'. */
export async function parts(db: Database, practiceId: string, platformName: string) {
  const pid = await platformId(db, practiceId, platformName);
  const rows = await db
    .select({ id: components.id, referenceCode: components.referenceCode })
    .from(components)
    .where(eq(components.platformId, pid));
  const bySuffix = new Map(rows.map((r) => [r.referenceCode.split('-').slice(2).join('-'), r.id]));
  return (suffix: string) => {
    const id = bySuffix.get(suffix);
    if (!id) throw new Error(`no part ${suffix} on ${platformName}`);
    return id;
  };
}

/** A new Larkspur patient with implants placed last month on the given platform. */
export async function patientWithImplants(
  ctx: TestContext,
  chartNumber: string,
  platformName: string,
  implants: { fdi: number; axis?: [number, number, number] }[],
) {
  const practiceId = await larkspurId(ctx.db);
  const pid = await platformId(ctx.db, practiceId, platformName);
  const [patient] = await ctx.db
    .insert(patients)
    .values({ practiceId, chartNumber, givenName: 'Test', familyName: chartNumber, birthDate: '1970-01-01' })
    .returning({ id: patients.id });
  const siteIds: Record<number, string> = {};
  for (const i of implants) {
    const [site] = await ctx.db
      .insert(implantSites)
      .values({ practiceId, patientId: patient.id, fdi: i.fdi, status: 'placed' })
      .returning({ id: implantSites.id });
    siteIds[i.fdi] = site.id;
    await ctx.db.insert(placements).values({
      practiceId,
      patientId: patient.id,
      siteId: site.id,
      platformId: pid,
      placedOn: '2026-10-01',
      surgeonName: 'Dr Test',
      lengthMm: 10,
      axisX: i.axis?.[0],
      axisY: i.axis?.[1],
      axisZ: i.axis?.[2],
    });
  }
  return { patientId: patient.id, siteIds };
}

/**
 * A new Larkspur patient with one implant and one part of its platform in place (installed last
 * month, no torque logged yet): a part of its own for a test that retires, replaces or re-torques
 * one, so no other test sees the change.
 */
export async function patientWithPart(
  ctx: TestContext,
  chartNumber: string,
  platformName: string,
  partSuffix: string,
  fdi = 35,
) {
  const { patientId, siteIds } = await patientWithImplants(ctx, chartNumber, platformName, [{ fdi }]);
  const practiceId = await larkspurId(ctx.db);
  const part = await parts(ctx.db, practiceId, platformName);
  const [instance] = await ctx.db
    .insert(componentInstances)
    .values({
      practiceId,
      patientId,
      siteId: siteIds[fdi],
      componentId: part(partSuffix),
      lot: `${partSuffix}-${chartNumber}`,
      installedOn: '2026-10-15',
    })
    .returning({ id: componentInstances.id });
  return { patientId, siteId: siteIds[fdi], instanceId: instance.id };
}

/**
 * Where the catalogue tests add parts of their own: the demo practice's Solvra CN 4.3 platform, with
 * the administrator's and the dentist's sessions. `tag` keeps each file's reference codes apart.
 */
export async function testPlatform(ctx: TestContext, tag: string) {
  const admin = await signIn(ctx, 'practice_admin');
  const dentist = await signIn(ctx, 'dentist');
  const practiceId = await larkspurId(ctx.db);
  const platform = await platformId(ctx.db, practiceId, 'Solvra CN 4.3');
  let made = 0;
  /** The administrator's request for a new part of the platform (the reply is the caller's to check). */
  const addPart = (kind: string, values: object) => {
    const n = ++made;
    return ctx.http
      .post('/api/catalogue/components')
      .set('Cookie', admin)
      .send({
        platformId: platform,
        kind,
        name: `Test ${kind} ${tag}${n}`,
        referenceCode: `SCN-43-${tag}${n}`,
        ...values,
      });
  };
  /** A new part of the platform, so no other test sees its edits. */
  const newPart = async (kind: string, values: object) => {
    const res = await addPart(kind, values);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body as { id: string; name: string; version: number };
  };
  return { admin, dentist, practiceId, platform, addPart, newPart };
}

export type TestPlatform = Awaited<ReturnType<typeof testPlatform>>;
