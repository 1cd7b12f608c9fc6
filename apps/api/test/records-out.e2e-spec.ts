// Records out over real HTTP: the FHIR export of every demo patient checked by the `fhir`
// package's validator and its UDI read back with parseUdi; the implant passport and the
// retrieval card parsed back with pdf-parse and checked against each implant's rows; the passport
// e-mailed through the job queue to the SMTP catcher only with the patient's consent.
import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendarDate } from '@torquetrail/contracts';
import { fdiToUniversal, gtinCheckDigit, parseUdi } from '@torquetrail/domain';
import {
  auditEvents,
  componentInstances,
  components,
  implantSites,
  implantSystems,
  passportMails,
  patients,
  placements,
  platforms,
  practices,
  restorations,
  restorationSites,
} from '../src/db/schema/index.js';
import { validatorErrors } from './support/fhir-validation.js';
import { until } from './support/recalls.js';
import { patientId, signIn, siteId, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfPageTexts } from './support/pdf-text.js';

const mailHttp = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;

let ctx: TestContext;
let dentist: string;
let admin: string;
beforeAll(async () => {
  ctx = await startTestApp();
  [dentist, admin] = await Promise.all([signIn(ctx, 'dentist'), signIn(ctx, 'practice_admin')]);
});
afterAll(() => ctx.close());

const binary = (path: string, cookie: string) =>
  ctx.http.get(path).set('Cookie', cookie).buffer(true).parse(replyBytes);

/** Each live implant of a patient as the database holds it (current placement, platform, system). */
async function implantsOf(chart: string) {
  const pid = await patientId(ctx.db, chart);
  return ctx.db
    .select({
      siteId: implantSites.id,
      fdi: implantSites.fdi,
      placedOn: placements.placedOn,
      lot: placements.lot,
      lengthMm: placements.lengthMm,
      system: implantSystems.name,
      platform: platforms.name,
      diameterMm: platforms.diameterMm,
    })
    .from(placements)
    .innerJoin(implantSites, eq(implantSites.id, placements.siteId))
    .innerJoin(platforms, eq(platforms.id, placements.platformId))
    .innerJoin(implantSystems, eq(implantSystems.id, platforms.systemId))
    .where(
      and(
        eq(placements.patientId, pid),
        sql`not exists (select 1 from placements newer where newer.supersedes_id = ${placements.id})`,
        sql`${implantSites.status} not in ('failed', 'removed')`,
      ),
    )
    .orderBy(asc(implantSites.fdi));
}

const partsOf = (site: string) =>
  ctx.db
    .select({ kind: components.kind, referenceCode: components.referenceCode, lot: componentInstances.lot })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .where(and(eq(componentInstances.siteId, site), isNull(componentInstances.removedOn)));

const restoredSites = async (chart: string) =>
  ctx.db
    .selectDistinct({ fdi: implantSites.fdi, retention: restorations.retention })
    .from(restorationSites)
    .innerJoin(restorations, eq(restorations.id, restorationSites.restorationId))
    .innerJoin(implantSites, eq(implantSites.id, restorationSites.siteId))
    .where(
      and(
        eq(restorations.patientId, await patientId(ctx.db, chart)),
        eq(restorations.status, 'delivered'),
        sql`not exists (select 1 from restorations newer where newer.supersedes_id = ${restorations.id})`,
      ),
    )
    .orderBy(asc(implantSites.fdi));

describe('FHIR export', () => {
  it('is a validator-clean Bundle for every demo patient, with a Device per implant and per part', async () => {
    const everyone = await ctx.db.select().from(patients).orderBy(asc(patients.chartNumber));
    const larkspur = everyone.filter((p) => p.chartNumber.startsWith('LL-'));
    expect(larkspur.length).toBeGreaterThanOrEqual(5);
    for (const p of everyone) {
      const cookie = p.chartNumber.startsWith('LL-') ? dentist : await signIn(ctx, 'otherPracticeDentist');
      const res = await binary(`/api/patients/${p.id}/fhir`, cookie);
      expect(res.status, p.chartNumber).toBe(200);
      expect(res.headers['content-type']).toMatch(/^application\/fhir\+json/);
      const bundle = JSON.parse((res.body as Buffer).toString('utf8'));
      expect(validatorErrors(bundle), p.chartNumber).toEqual([]);
      expect(bundle.type).toBe('collection');
      const resources = (bundle.entry as { resource: { resourceType: string; id: string } }[]).map((e) => e.resource);
      expect(resources[0]).toMatchObject({ resourceType: 'Patient', id: p.id, birthDate: p.birthDate });
      const implants = await implantsOf(p.chartNumber);
      const parts = (await Promise.all(implants.map((i) => partsOf(i.siteId)))).flat();
      const retained = parts.filter((x) => x.kind !== 'impression-coping');
      // Copings and scan bodies of impressions are Devices too, `inactive` (records-out-impressions.e2e-spec.ts).
      expect(
        resources.filter((r) => r.resourceType === 'Device' && (r as { status?: string }).status === 'active'),
        p.chartNumber,
      ).toHaveLength(implants.length + retained.length);
      const procedures = resources.filter((r) => r.resourceType === 'Procedure');
      expect(procedures.length).toBeGreaterThanOrEqual(implants.length);
    }
  });

  it('carries a placement UDI that parseUdi reads back from carrierHRF', async () => {
    const site = await siteId(ctx.db, 'LL-1004', 24);
    const options = await ctx.http.get(`/api/sites/${site}/placement-options`).set('Cookie', dentist);
    expect(options.status).toBe(200);
    const platform = options.body.systems[0].platforms[0];
    const gtin14 = `0761234500001${gtinCheckDigit('0761234500001')}`;
    const udi = `(01)${gtin14}(17)300630(10)FX24-7(21)SN-0924`;
    const placed = await ctx.http
      .post(`/api/sites/${site}/placements`)
      .set('Cookie', dentist)
      .send({ platformId: platform.id, placedOn: '2026-11-20', lengthMm: 10, lot: 'FX24-7', udi });
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);

    const res = await binary(`/api/patients/${await patientId(ctx.db, 'LL-1004')}/fhir`, dentist);
    const bundle = JSON.parse((res.body as Buffer).toString('utf8'));
    expect(validatorErrors(bundle)).toEqual([]);
    const device = (bundle.entry as { resource: Record<string, unknown> }[])
      .map((e) => e.resource)
      .find((r) => r.id === placed.body.id)!;
    const carrier = (device.udiCarrier as { deviceIdentifier: string; issuer: string; carrierHRF: string }[])[0];
    const original = parseUdi(udi);
    expect(parseUdi(carrier.carrierHRF)).toEqual(original);
    expect(carrier).toMatchObject({ deviceIdentifier: gtin14, issuer: 'http://hl7.org/fhir/NamingSystem/gs1-di' });
    expect(device).toMatchObject({ lotNumber: 'FX24-7', serialNumber: 'SN-0924', expirationDate: '2030-06-30' });
  });

  it('is audited as an export naming the patient', async () => {
    const pid = await patientId(ctx.db, 'LL-1001');
    const res = await binary(`/api/patients/${pid}/fhir`, admin);
    expect(res.status).toBe(200);
    const rows = await until(async () => {
      const found = await ctx.db
        .select()
        .from(auditEvents)
        .where(and(eq(auditEvents.patientId, pid), eq(auditEvents.action, 'export')));
      return found.length > 0 ? found : null;
    }, 5_000);
    expect(rows.map((r) => r.route)).toContainEqual(expect.stringMatching(/^GET \/(api\/)?patients\/:id\/fhir$/));
  });
});

describe('implant passport', () => {
  it('names each implant in plain language with its data, the practice contact, the recall and the cautions', async () => {
    for (const chart of ['LL-1001', 'LL-1002', 'LL-1003', 'LL-1004', 'LL-1005']) {
      const pid = await patientId(ctx.db, chart);
      const res = await binary(`/api/patients/${pid}/passport.pdf`, dentist);
      expect(res.status, chart).toBe(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['content-disposition']).toBe(`attachment; filename="implant-passport-${chart}.pdf"`);
      const pages = await pdfPageTexts(res.body as Buffer);
      const text = pages.join(' ');
      const [patient] = await ctx.db.select().from(patients).where(eq(patients.id, pid));
      for (const page of pages) {
        expect(page).toContain(`${patient.givenName} ${patient.familyName}`);
        expect(page).toContain(`chart ${chart}`);
        expect(page).toContain(`born ${writeCalendarDate(patient.birthDate, 'day-month-year')}`);
        expect(page).toContain('Larkspur Lane Dental');
        expect(page).toMatch(/printed by Dr Ines Calloway on \d{1,2} [A-Z][a-z]{2,3} \d{4}/);
      }
      expect(text).toContain('Phone +44 20 7946 0123');
      for (const i of await implantsOf(chart)) {
        expect(text).toContain(`Implant at site ${i.fdi} (FDI) / ${fdiToUniversal(i.fdi)} (Universal)`);
        expect(text).toContain(`Placed on ${writeCalendarDate(i.placedOn, 'day-month-year')}`);
        expect(text).toContain(`System: ${i.system}`);
        expect(text).toContain(`platform ${i.platform}`);
        expect(text).toContain(`Size: ${i.diameterMm} mm wide × ${i.lengthMm} mm long`);
        expect(text).toContain(i.lot ? `lot ${i.lot}` : 'Identification:');
        for (const part of await partsOf(i.siteId)) {
          if (part.kind === 'impression-coping') continue;
          expect(text).toContain(`[${part.referenceCode}]${part.lot ? `, lot ${part.lot}` : ''}`);
        }
      }
      expect(text).toContain('Please note');
      expect(text).toContain("manufacturer's instructions");
    }
  });

  it('says how each restoration is held and at what torque its screws were tightened', async () => {
    const okafor = (
      await pdfPageTexts(
        (await binary(`/api/patients/${await patientId(ctx.db, 'LL-1003')}/passport.pdf`, dentist)).body as Buffer,
      )
    ).join(' ');
    expect(okafor).toContain('cemented onto an abutment');
    expect(okafor).toContain('cannot be removed without cutting it (not retrievable)');
    const harold = (
      await pdfPageTexts(
        (await binary(`/api/patients/${await patientId(ctx.db, 'LL-1001')}/passport.pdf`, dentist)).body as Buffer,
      )
    ).join(' ');
    expect(harold).toContain('screwed directly onto the implant');
    expect(harold).toContain('a dentist can unscrew and remove it (retrievable)');
    expect(harold).toMatch(/Prosthetic screw: .*tightened to \d+(\.\d)? N·cm on \d{1,2} [A-Z][a-z]{2,3} \d{4}/);
    expect(harold).toMatch(/Your next check-up is due on \d{1,2} [A-Z][a-z]+ \d{4}\./);
  });
});

describe('retrieval card', () => {
  it('has one page per restored site with the parts chain, torques, retention and the caution', async () => {
    for (const chart of ['LL-1001', 'LL-1002', 'LL-1003', 'LL-1004']) {
      const res = await binary(`/api/patients/${await patientId(ctx.db, chart)}/retrieval-card.pdf`, dentist);
      expect(res.status, chart).toBe(200);
      const pages = await pdfPageTexts(res.body as Buffer);
      const restored = await restoredSites(chart);
      expect(restored.length, chart).toBeGreaterThan(0);
      expect(pages, chart).toHaveLength(restored.length);
      const implants = await implantsOf(chart);
      restored.forEach((r, n) => {
        const page = pages[n];
        expect(page).toContain(`Retrieval card: site ${r.fdi} (FDI) / ${fdiToUniversal(r.fdi)} (Universal)`);
        expect(page).toContain(
          r.retention === 'cement-on-abutment' ? 'Can be unscrewed: no.' : 'Can be unscrewed: yes.',
        );
        expect(page).toContain('Parts chain, from the implant outward');
        expect(page).toMatch(
          /Date of the last torque on this site: \d{1,2} [A-Z][a-z]{2,3} \d{4}|No torque is recorded on this site/,
        );
        expect(page).toContain("manufacturer's instructions");
        expect(page).toContain(`chart ${chart}`);
        expect(page).toContain('printed by Dr Ines Calloway');
        const implant = implants.find((i) => i.fdi === r.fdi)!;
        expect(page).toContain(`${implant.diameterMm} × ${implant.lengthMm} mm`);
      });
      for (const [n, r] of restored.entries()) {
        const site = implants.find((i) => i.fdi === r.fdi)!.siteId;
        for (const part of await partsOf(site)) {
          if (part.kind === 'impression-coping') continue;
          expect(pages[n]).toContain(`[${part.referenceCode}]`);
        }
      }
    }
  });

  it('for a patient with nothing restored is one page that says so', async () => {
    const res = await binary(`/api/patients/${await patientId(ctx.db, 'LL-1005')}/retrieval-card.pdf`, dentist);
    const pages = await pdfPageTexts(res.body as Buffer);
    expect(pages).toHaveLength(1);
    expect(pages[0]).toContain('No restored implant site is recorded for this patient.');
  });
});

interface CaughtMail {
  headers: Record<string, string>;
  envelopeTo: string[];
  attachments: { filename: string; contentType: string }[];
}

describe('passport by e-mail', () => {
  it('is sent through the job queue to the patient with consent, once, logged and audited', async () => {
    const pid = await patientId(ctx.db, 'LL-1002');
    const status = await ctx.http.get(`/api/patients/${pid}/passport/mails`).set('Cookie', dentist);
    expect(status.status).toBe(200);
    expect(status.body.emailBlockedReason).toBeNull();
    const made = await ctx.http.post(`/api/patients/${pid}/passport/mails`).set('Cookie', dentist).send({});
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    expect(made.body).toMatchObject({ sentTo: 'imogen.farrow@mail.example', status: 'pending' });
    const caught = async () =>
      ((await (await fetch(mailHttp)).json()) as CaughtMail[]).filter(
        (m) => m.headers['x-torquetrail-passport-mail'] === made.body.id,
      );
    const found = await until(async () => ((await caught()).length > 0 ? caught() : null), 15_000);
    expect(found).toHaveLength(1);
    expect(found[0].envelopeTo).toEqual(['imogen.farrow@mail.example']);
    expect(found[0].attachments).toEqual([
      expect.objectContaining({ filename: 'implant-passport-LL-1002.pdf', contentType: 'application/pdf' }),
    ]);
    const sent = await until(async () => {
      const [row] = await ctx.db.select().from(passportMails).where(eq(passportMails.id, made.body.id));
      return row.status === 'sent' ? row : null;
    }, 10_000);
    expect(sent.messageId).toBeTruthy();
    const audited = await ctx.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.recordId, made.body.id), eq(auditEvents.action, 'create')));
    expect(audited).toHaveLength(1);
    expect(audited[0].patientId).toBe(pid);
    const listed = await ctx.http.get(`/api/patients/${pid}/passport/mails`).set('Cookie', dentist);
    expect(listed.body.mails[0]).toMatchObject({ id: made.body.id, status: 'sent' });
    // Logged in the Timeline of each of the patient's sites, with who asked.
    const timeline = await ctx.http
      .get(`/api/sites/${await siteId(ctx.db, 'LL-1002', 45)}/timeline`)
      .set('Cookie', dentist);
    expect(timeline.body.events.filter((e: { kind: string }) => e.kind === 'passport-mail')).toEqual([
      expect.objectContaining({
        id: made.body.id,
        title: 'Implant passport e-mailed to the patient',
        detail: 'to imogen.farrow@mail.example',
        byName: 'Dr Ines Calloway',
      }),
    ]);
  });

  it('is refused without the patient e-mail consent or without an address, and nothing is queued', async () => {
    const pid = await patientId(ctx.db, 'LL-1003');
    await ctx.db.update(patients).set({ emailReminderConsent: false }).where(eq(patients.id, pid));
    const status = await ctx.http.get(`/api/patients/${pid}/passport/mails`).set('Cookie', dentist);
    expect(status.body.emailBlockedReason).toBe('The patient has not consented to e-mail');
    const refused = await ctx.http.post(`/api/patients/${pid}/passport/mails`).set('Cookie', dentist).send({});
    expect(refused.status).toBe(409);
    expect(refused.body.message).toBe('The patient has not consented to e-mail');
    await ctx.db.update(patients).set({ emailReminderConsent: true, email: null }).where(eq(patients.id, pid));
    const noAddress = await ctx.http.post(`/api/patients/${pid}/passport/mails`).set('Cookie', dentist).send({});
    expect(noAddress.status).toBe(409);
    expect(noAddress.body.message).toBe('The patient has no e-mail address on record');
    expect(await ctx.db.select().from(passportMails).where(eq(passportMails.patientId, pid))).toEqual([]);
  });

  it('refuses a body with fields it does not know', async () => {
    const pid = await patientId(ctx.db, 'LL-1001');
    const res = await ctx.http
      .post(`/api/patients/${pid}/passport/mails`)
      .set('Cookie', dentist)
      .send({ to: 'someone@else.example' });
    expect(res.status).toBe(400);
  });
});

describe('practice contact on the passport', () => {
  it('says so when the practice has recorded none', async () => {
    const pid = await patientId(ctx.db, 'LL-1005');
    const [p] = await ctx.db.select({ practiceId: patients.practiceId }).from(patients).where(eq(patients.id, pid));
    const [before] = await ctx.db.select().from(practices).where(eq(practices.id, p.practiceId));
    await ctx.db.update(practices).set({ phone: null, email: null }).where(eq(practices.id, p.practiceId));
    try {
      const text = (
        await pdfPageTexts((await binary(`/api/patients/${pid}/passport.pdf`, dentist)).body as Buffer)
      ).join(' ');
      expect(text).toContain('Phone and e-mail: not recorded by the practice.');
    } finally {
      await ctx.db
        .update(practices)
        .set({ phone: before.phone, email: before.email })
        .where(eq(practices.id, p.practiceId));
    }
  });
});
