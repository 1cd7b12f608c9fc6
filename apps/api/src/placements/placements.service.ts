import { ConflictException, Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  type AddSiteBody,
  type ArchSite,
  type ClosureKind,
  MANUFACTURER_CAUTION,
  PlacementAmendmentBody,
  type PlacementBody,
  type PlacementOptionsReply,
  type PlacementRecord,
  describeUdiError,
} from '@torquetrail/contracts';
import {
  UdiError,
  checkUdiForPlacement,
  fdiToUniversal,
  isPrimaryTooth,
  isValidFdi,
  parseUdi,
} from '@torquetrail/domain';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { asSiteRow, assertCan, type Scope } from '../authz/scope.js';
import { assertAmendable } from '../common/amendment-conflict.js';
import { keepAbsent } from '../common/keep-absent.js';
import { fieldError } from '../common/field-error.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { datePrinter } from '../common/printed-dates.js';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database, type Db } from '../db/database.js';
import * as repo from './placements.repository.js';

/** What a placement records, whether first recorded or amended (closure parts only at surgery). */
type PlacementFields = Omit<z.output<typeof PlacementBody>, 'closureComponentId' | 'closureLot'>;

/**
 * Today's date in the time zone furthest ahead of UTC (UTC+14): a clinic anywhere may record a
 * placement of its own today, and no placement dated after that can have happened yet.
 */
const latestPossibleToday = () => new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10);

function assertSiteCurrent(status: string | undefined) {
  if (status !== 'planned')
    throw new ConflictException(`This site is ${status ?? 'gone'}, not planned: amend the recorded placement instead`);
}

/** The GTIN of a UDI that checkFields has accepted, stored for the lot look-up's index. */
function gtinOf(udi: string | null | undefined): string | null {
  if (!udi) return null;
  try {
    return parseUdi(udi).gtin;
  } catch (e) {
    if (e instanceof UdiError) return null;
    throw e;
  }
}

@Injectable()
export class PlacementsService {
  constructor(@Inject(DB) private readonly db: Database) {}

  /** A planned site at a permanent FDI position where the patient has no live site (a failed or removed one may be there). */
  async addSite(
    ability: AppAbility,
    scope: Scope,
    patientId: string,
    body: z.output<typeof AddSiteBody>,
  ): Promise<ArchSite> {
    const patient = assertCan(
      ability,
      'read',
      'Patient',
      await repo.findVisiblePatient(this.db, scope, patientId),
      'patient',
    );
    const row = { practiceId: patient.practiceId, patientId: patient.id };
    assertCan(ability, 'create', 'ImplantSite', row, 'patient');
    if (!isValidFdi(body.fdi)) throw fieldError({ fdi: `${String(body.fdi)} is not an FDI (ISO 3950) tooth position` });
    // Implants replace permanent teeth; fdiToUniversal also throws for a position that does not exist.
    if (isPrimaryTooth(body.fdi))
      throw fieldError({ fdi: `${body.fdi} is a primary tooth: an implant site is a permanent position (11–48)` });
    fdiToUniversal(body.fdi);
    const existing = await repo.findLiveSiteAt(this.db, patient.practiceId, patient.id, body.fdi);
    // A failed or removed site stays in the record; a new site may be planned at its position.
    if (existing) throw new ConflictException(`This patient already has a ${existing.status} site at ${body.fdi}`);
    try {
      const site = await auditedTransaction(this.db, async (tx) => {
        const inserted = await repo.insertPlannedSite(tx, { ...row, fdi: body.fdi });
        reportChange({ type: 'ImplantSite', id: inserted.id, patientId: patient.id, after: { fdi: body.fdi } });
        return inserted;
      });
      return {
        id: site.id,
        fdi: site.fdi,
        status: site.status,
        maintenanceStatus: 'not-examined',
        lastExamDate: null,
        systemName: null,
      };
    } catch (e) {
      if (isUniqueViolation(e)) throw new ConflictException(`This patient already has a site at ${body.fdi}`);
      throw e;
    }
  }

  private async placeableSite(ability: AppAbility, scope: Scope, siteId: string) {
    return assertCan(
      ability,
      'create',
      'Placement',
      asSiteRow(await repo.findVisibleSite(this.db, scope, siteId)),
      'implant site',
    );
  }

  /** The catalogue of the site's practice, reduced to what a placement needs. */
  async placementOptions(ability: AppAbility, scope: Scope, siteId: string): Promise<PlacementOptionsReply> {
    const site = await this.placeableSite(ability, scope, siteId);
    const { rows, parts } = await repo.listPlacementOptions(this.db, site.practiceId);
    const systems = new Map<string, PlacementOptionsReply['systems'][number]>();
    for (const r of rows) {
      let system = systems.get(r.systemId);
      if (!system)
        systems.set(
          r.systemId,
          (system = { id: r.systemId, name: r.systemName, manufacturer: r.manufacturer, platforms: [] }),
        );
      system.platforms.push({
        id: r.platformId,
        name: r.platformName,
        diameterMm: r.diameterMm,
        connection: r.connection,
        platformShift: r.platformShift,
        components: parts
          .filter((p) => p.platformId === r.platformId)
          .map((p) => ({
            id: p.id,
            kind: p.kind as ClosureKind,
            name: p.name,
            referenceCode: p.referenceCode,
            requiresLot: p.requiresLot,
          })),
      });
    }
    return { siteId: site.id, fdi: site.fdi, caution: MANUFACTURER_CAUTION, systems: [...systems.values()] };
  }

  /**
   * Field checks shared by a placement and its amendment: the platform belongs to the site's
   * practice, the date is not in the future, and a UDI is parsed with the domain's `parseUdi`.
   * Returns the lot to store (typed, or read from the UDI).
   */
  private async checkFields(
    db: Db,
    practiceId: string,
    body: PlacementFields,
    fields: Record<string, string>,
    user: SessionUser,
  ): Promise<string | null> {
    if (body.placedOn > latestPossibleToday()) fields.placedOn = 'The placement date cannot be in the future';
    if (!(await repo.findPlatformOfPractice(db, practiceId, body.platformId)))
      fields.platformId = "Not a platform of this site's practice catalogue";
    let lot = body.lot;
    if (body.udi) {
      try {
        const udi = parseUdi(body.udi);
        // The lot and expiry checks are the domain's, as in the web form.
        // Its dates in the signed-in user's practice's order (issue 15 §7).
        const dates = datePrinter(user.dateFormat);
        for (const finding of checkUdiForPlacement(udi, { placedOn: body.placedOn, lot }, (iso) => dates.date(iso))) {
          if (finding.code === 'expired-before-placement' && fields.placedOn) continue;
          fields[finding.field] ??= finding.message;
        }
        lot ??= udi.lot ?? null;
      } catch (e) {
        if (!(e instanceof UdiError)) throw e;
        fields.udi = describeUdiError(e.code, e.message);
      }
    }
    return lot;
  }

  /** Records what was placed; the site becomes placed; a closure part is installed — one transaction. */
  async record(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    siteId: string,
    body: z.output<typeof PlacementBody>,
  ): Promise<PlacementRecord> {
    const site = await this.placeableSite(ability, scope, siteId);
    assertSiteCurrent(site.status);
    const fields: Record<string, string> = {};
    const lot = await this.checkFields(this.db, site.practiceId, body, fields, user);
    let closure: Awaited<ReturnType<typeof repo.findComponentOfPlatform>> | null = null;
    if (body.closureComponentId && !fields.platformId) {
      closure = await repo.findComponentOfPlatform(this.db, site.practiceId, body.platformId, body.closureComponentId);
      if (!closure || (closure.kind !== 'healing-abutment' && closure.kind !== 'cover-screw'))
        fields.closureComponentId = 'Choose a healing abutment or cover screw of the chosen platform';
      else if (closure.requiresLot && !body.closureLot)
        fields.closureLot = `The lot number of the ${closure.name} is required`;
    }
    if (Object.keys(fields).length > 0) throw fieldError(fields);
    const ids = await auditedTransaction(this.db, async (tx) => {
      // Re-read under the lock: of two placements of one planned site only the first is saved.
      assertSiteCurrent((await repo.lockSite(tx, site.id))?.status);
      const values = {
        ...this.values(body, lot),
        practiceId: site.practiceId,
        patientId: site.patientId,
        siteId: site.id,
        surgeonUserId: user.id,
        surgeonName: `${user.displayName} (${user.practiceName})`,
        recordedBy: user.id,
      };
      const id = await repo.insertPlacement(tx, values);
      reportChange({ type: 'Placement', id, patientId: site.patientId, after: values });
      const closureId = closure
        ? await repo.insertClosurePart(tx, {
            practiceId: site.practiceId,
            patientId: site.patientId,
            siteId: site.id,
            componentId: closure.id,
            lot: body.closureLot,
            installedOn: body.placedOn,
            recordedBy: user.id,
          })
        : null;
      await repo.setSiteStatus(tx, site.id, 'placed');
      return { id, closureId };
    });
    return this.reply(ids.id, ids.closureId);
  }

  /** An amendment is a new row superseding the old one; the old row is never updated. */
  async amend(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: z.output<typeof PlacementAmendmentBody>,
  ): Promise<PlacementRecord> {
    const old = assertAmendable(
      ability,
      'Placement',
      await repo.findVisiblePlacement(this.db, scope, id),
      'placement',
      'placements',
    );
    // What the amendment leaves out stays as it was.
    const next = keepAbsent(PlacementAmendmentBody, body, await this.reply(old.id, null));
    const fields: Record<string, string> = {};
    const lot = await this.checkFields(this.db, old.practiceId, next, fields, user);
    if (Object.keys(fields).length > 0) throw fieldError(fields);
    // Of two concurrent amendments of one placement the database saves the first (insertAmendment).
    const values = {
      ...this.values(next, lot),
      practiceId: old.practiceId,
      patientId: old.patientId,
      siteId: old.siteId,
      // The surgeon who placed stays the surgeon; the amendment records who corrected it.
      surgeonUserId: old.surgeonUserId,
      surgeonName: old.surgeonName,
      supersedesId: old.id,
      amendmentReason: body.amendmentReason,
      recordedBy: user.id,
    };
    const newId = await auditedTransaction(this.db, async (tx) => {
      const inserted = await repo.insertPlacementAmendment(tx, values);
      reportChange({ type: 'Placement', id: inserted, patientId: old.patientId, before: old, after: values });
      return inserted;
    });
    return this.reply(newId, null);
  }

  private values(body: PlacementFields, lot: string | null) {
    return {
      platformId: body.platformId,
      placedOn: body.placedOn,
      lengthMm: body.lengthMm,
      lot,
      udi: body.udi,
      gtin: gtinOf(body.udi),
      insertionTorqueNcm: body.insertionTorqueNcm,
      stabilityIsq: body.stabilityIsq,
      grafting: body.grafting,
      loadingProtocol: body.loadingProtocol,
      axisX: body.axis?.x ?? null,
      axisY: body.axis?.y ?? null,
      axisZ: body.axis?.z ?? null,
      notes: body.notes,
    };
  }

  private async reply(id: string, closureInstanceId: string | null): Promise<PlacementRecord> {
    const p = await repo.loadPlacement(this.db, id);
    const { axisX, axisY, axisZ, recordedByName: _by, ...rest } = p;
    return {
      ...rest,
      axis: axisX !== null && axisY !== null && axisZ !== null ? { x: axisX, y: axisY, z: axisZ } : null,
      recordedAt: p.recordedAt.toISOString(),
      closureInstanceId,
    };
  }
}
