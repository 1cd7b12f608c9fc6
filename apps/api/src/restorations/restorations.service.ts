import { ConflictException, Inject, Injectable } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import {
  type CantileverSettings,
  CLOSURE_KINDS,
  type DeliveryBody,
  type LabPrescriptionSummary,
  PlanAmendmentBody,
  type PlanBody,
  type RestorableSitesReply,
  type RestorationDetail,
  type RestorationListReply,
} from '@torquetrail/contracts';
import { RULES_VERSION, fdiToUniversal, isRetrievable } from '@torquetrail/domain';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { keepAbsent } from '../common/keep-absent.js';
import { assertCan, assertCanList, type Scope, sharedSitesOf } from '../authz/scope.js';
import { alreadyAmended } from '../common/amendment-conflict.js';
import { fieldError } from '../common/field-error.js';
import { reportChange } from '../common/audit-context.js';
import { cantileverSettings } from '../db/practice-settings.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database, type Tx } from '../db/database.js';
import { checkPlan } from './plan-check.js';
import * as repo from './restorations.repository.js';

type PlanInput = z.output<typeof PlanBody>;
type AmendInput = z.output<typeof PlanAmendmentBody>;
type DeliveryInput = z.output<typeof DeliveryBody>;

/** Parts the delivery replaces: what sat on the implant while it healed (the closure parts). */
const HEALING_KINDS = CLOSURE_KINDS;
/** Parts that hold a restoration itself; they come out with it at every site it spans. */
const RETAINING_KINDS = ['prosthetic-screw', 'set-screw'] as const;

/**
 * A new restoration delivered on a site replaces the one delivered there before [decision: a
 * splinted restoration comes out as a whole]. The old one becomes 'removed' (its row and history
 * stay); its parts at the re-restored sites, and its retaining screws at its other sites, get
 * removedOn. Abutments and multi-units at its other sites stay in place.
 */
async function retirePreviousRestorations(tx: Tx, restorationId: string, siteIds: string[], on: string) {
  const previous = await repo.findDeliveredAt(tx, siteIds, restorationId);
  if (previous.length > 0) await repo.removeRestorations(tx, previous, siteIds, RETAINING_KINDS, on, restorationId);
}

/** Only a plan not yet delivered is re-planned. */
function assertStillPlanned(row: repo.RestorationRow) {
  if (row.status !== 'planned')
    throw new ConflictException(
      'A delivered restoration is not re-planned; record a complication or a new restoration',
    );
}

/** Only the current version of a plan not yet delivered is amended. */
function assertAmendable(row: repo.RestorationRow) {
  if (row.supersededById) throw alreadyAmended('restorations');
  assertStillPlanned(row);
}

/** Only the current version of a plan is delivered, and only once. */
function assertDeliverable(row: repo.RestorationRow) {
  if (row.supersededById) throw new ConflictException('This version was amended; deliver the current version');
  if (row.status !== 'planned') throw new ConflictException('This restoration is already delivered');
}

@Injectable()
export class RestorationsService {
  constructor(@Inject(DB) private readonly db: Database) {}

  private async visiblePatient(ability: AppAbility, scope: Scope, patientId: string) {
    return assertCan(
      ability,
      'read',
      'Patient',
      await repo.findVisiblePatientBrief(this.db, scope, patientId),
      'patient',
    );
  }

  async restorableSites(ability: AppAbility, scope: Scope, patientId: string): Promise<RestorableSitesReply> {
    const patient = await this.visiblePatient(ability, scope, patientId);
    assertCanList(ability, scope, 'ImplantSite', patient);
    // A failed or removed implant is out of the mouth: nothing can be restored on it.
    const rows = (await repo.listRestorableSites(this.db, patient.id, sharedSitesOf(scope, patient.id))).filter(
      (s) => s.status !== 'failed' && s.status !== 'removed',
    );
    return {
      items: rows.map((s) => ({
        siteId: s.siteId,
        fdi: s.fdi,
        universal: fdiToUniversal(s.fdi),
        status: s.status,
        platformId: s.platformId,
        systemName: s.systemName,
        platformName: s.platformName,
        connection: s.connection,
        diameterMm: s.diameterMm,
        axis: s.axisX !== null && s.axisY !== null && s.axisZ !== null ? [s.axisX, s.axisY, s.axisZ] : null,
      })),
    };
  }

  async list(ability: AppAbility, scope: Scope, patientId: string): Promise<RestorationListReply> {
    const patient = await this.visiblePatient(ability, scope, patientId);
    const sites = sharedSitesOf(scope, patient.id);
    const asRow = { practiceId: patient.practiceId, patientId: patient.id };
    // The restorations of the sites the user may read them on: all, or those of a share's chosen sites.
    const readable = sites
      ? sites.filter((siteId) => ability.can('read', subject('Restoration', { ...asRow, siteId })))
      : ability.can('read', subject('Restoration', asRow))
        ? null
        : [];
    if (readable?.length === 0) return { items: [] };
    return { items: await this.details(await repo.listRestorationsOfPatient(this.db, patient.id, readable)) };
  }

  async detail(ability: AppAbility, scope: Scope, id: string): Promise<RestorationDetail> {
    const row = assertCan(
      ability,
      'read',
      'Restoration',
      await repo.findVisibleRestoration(this.db, scope, id),
      'restoration',
    );
    return (await this.details([row]))[0];
  }

  /** Saves a plan as 'planned': errors block it, warnings must be acknowledged (stored with user and time). */
  async create(ability: AppAbility, user: SessionUser, scope: Scope, body: PlanInput): Promise<RestorationDetail> {
    const patient = await this.visiblePatient(ability, scope, body.patientId);
    assertCan(ability, 'create', 'Restoration', { practiceId: patient.practiceId, patientId: patient.id }, 'patient');
    const id = await auditedTransaction(this.db, async (tx) => {
      const inserted = await this.insertPlan(tx, user, patient, body, null);
      reportChange({ type: 'Restoration', id: inserted, patientId: patient.id, after: body });
      return inserted;
    });
    return this.detail(ability, scope, id);
  }

  /** An amendment is a new version superseding the old one; only a plan not yet delivered can be amended. */
  async amend(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: AmendInput,
  ): Promise<RestorationDetail> {
    const old = assertCan(
      ability,
      'amend',
      'Restoration',
      await repo.findVisibleRestoration(this.db, scope, id),
      'restoration',
    );
    assertAmendable(old);
    const patient = await repo.findVisiblePatientBrief(this.db, scope, old.patientId);
    const newId = await auditedTransaction(this.db, async (tx) => {
      // The lock keeps a delivery out until this amendment ends; between two amendments the
      // unique index on supersedes_id decides (insertAmendment), so only the status is re-read.
      await repo.shareLockRestoration(tx, old.id);
      assertStillPlanned(await repo.findVisibleRestoration(tx, scope, old.id));
      const inserted = await this.insertPlan(
        tx,
        user,
        patient,
        {
          // What the amendment leaves out stays as it was; acknowledgements are the amending
          // clinician's own, for the findings of the new version, and are never carried over.
          ...keepAbsent(PlanAmendmentBody, body, old),
          acknowledgements: body.acknowledgements ?? [],
          patientId: old.patientId,
        },
        { supersedesId: old.id, amendmentReason: body.amendmentReason },
      );
      reportChange({ type: 'Restoration', id: inserted, patientId: old.patientId, before: old, after: body });
      return inserted;
    });
    return this.detail(ability, scope, newId);
  }

  private async insertPlan(
    tx: Tx,
    user: SessionUser,
    patient: { id: string; practiceId: string },
    body: PlanInput,
    amendment: { supersedesId: string; amendmentReason: string } | null,
  ) {
    const patientSites = await repo.listRestorableSites(tx, patient.id);
    const ids = body.sites
      .flatMap((s) => [
        s.abutmentComponentId,
        s.multiUnitComponentId,
        s.impressionCopingComponentId,
        ...s.screwComponentIds,
        s.attachmentComponentId,
        ...s.retainerComponentIds,
      ])
      .filter((x): x is string => !!x);
    const catalogue = new Map((await repo.findCatalogueParts(tx, patient.practiceId, ids)).map((c) => [c.askedId, c]));
    const { cantileverRatioLimit: ratio } = await cantileverSettings.read(tx, patient.practiceId);
    const checked = checkPlan(body, patientSites, catalogue, ratio);

    const values = {
      practiceId: patient.practiceId,
      patientId: patient.id,
      kind: body.kind,
      retention: body.retention,
      material: body.material,
      shade: body.shade,
      status: 'planned' as const,
      copingsSplinted: body.copingsSplinted,
      plannedBy: user.id,
      findings: checked.findings,
      rulesVersion: RULES_VERSION,
      labName: body.labName,
      labEmail: body.labEmail,
      dueOn: body.dueOn,
      notes: body.notes,
      provisional: body.provisional,
      plannedReplacementOn: body.plannedReplacementOn,
      cantileverLeftMm: body.cantileverLeftMm,
      cantileverRightMm: body.cantileverRightMm,
      apSpreadMm: body.apSpreadMm,
    };
    const id = amendment
      ? await repo.insertRestorationAmendment(tx, { ...values, ...amendment })
      : await repo.insertRestoration(tx, values);
    for (const s of checked.sites) {
      const restorationSiteId = await repo.insertRestorationSite(tx, {
        practiceId: patient.practiceId,
        restorationId: id,
        siteId: s.siteId,
        interface: s.interface,
        impressionCoping: s.impressionCoping,
        multiUnitAngleDeg: s.multiUnitAngleDeg,
        restorativeSpaceMm: s.restorativeSpaceMm,
        axisX: s.enteredAxis?.[0] ?? null,
        axisY: s.enteredAxis?.[1] ?? null,
        axisZ: s.enteredAxis?.[2] ?? null,
      });
      await repo.insertSiteComponents(
        tx,
        s.componentIds.map((componentId) => ({ practiceId: patient.practiceId, restorationSiteId, componentId })),
      );
    }
    const acknowledged = checked.findings.filter((f) => f.severity === 'warning');
    await repo.insertAcknowledgements(
      tx,
      acknowledged.map((f) => ({
        practiceId: patient.practiceId,
        restorationId: id,
        code: f.code,
        fdi: f.fdi ?? null,
        acknowledgedBy: user.id,
      })),
    );
    return id;
  }

  /**
   * Delivery, in one transaction: each part becomes a component instance (lot required where the
   * catalogue says so, and the part must fit the site's platform), healing abutments and cover
   * screws come out, the sites become 'restored'. Nothing is saved when any part is refused.
   */
  async deliver(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: DeliveryInput,
  ): Promise<RestorationDetail> {
    const row = assertCan(
      ability,
      'create',
      'ComponentInstance',
      await repo.findVisibleRestoration(this.db, scope, id),
      'restoration',
    );
    assertCan(ability, 'amend', 'Restoration', row, 'restoration');
    assertDeliverable(row);
    const today = new Date().toISOString().slice(0, 10);
    if (body.deliveredOn > today) throw fieldError({ deliveredOn: 'Cannot be in the future' });
    if (body.impressionTakenOn && body.impressionTakenOn > body.deliveredOn)
      throw fieldError({ impressionTakenOn: 'The impression cannot be taken after the delivery' });
    await auditedTransaction(this.db, async (tx) => {
      reportChange({ type: 'Restoration', id: row.id, patientId: row.patientId, before: row, after: body });
      // Re-read under the lock: a concurrent delivery or amendment committed meanwhile is seen.
      await repo.lockRestoration(tx, row.id);
      assertDeliverable(await repo.findVisibleRestoration(tx, scope, row.id));
      const { sites } = await repo.loadRestorationSites(tx, [row.id]);
      const catalogue = new Map(
        (
          await repo.findCatalogueParts(
            tx,
            row.practiceId,
            body.parts.map((p) => p.componentId),
          )
        ).map((c) => [c.askedId, c]),
      );
      const fields: Record<string, string> = {};
      const seen = new Set<string>();
      body.parts.forEach((p, i) => {
        const site = sites.find((s) => s.siteId === p.siteId);
        const part = catalogue.get(p.componentId);
        const key = `${p.siteId}|${part?.id ?? p.componentId}`;
        const repeated = seen.has(key);
        seen.add(key);
        if (!site) fields[`parts.${i}.siteId`] = 'This site is not part of the restoration';
        else if (repeated)
          fields[`parts.${i}.componentId`] = `This part is listed twice for ${site.fdi}: record each part once`;
        else if (!part) fields[`parts.${i}.componentId`] = 'No such part in the practice catalogue';
        else if (part.platformId !== site.platformId)
          fields[`parts.${i}.componentId`] =
            `${part.name} does not fit the platform at ${site.fdi} (${site.platformName})`;
        else if (part.kind === 'impression-coping')
          fields[`parts.${i}.componentId`] = 'Impression copings do not stay in the mouth';
        else if (part.requiresLot && !p.lot) fields[`parts.${i}.lot`] = `The lot number of ${part.name} is required`;
      });
      if (Object.keys(fields).length > 0) throw fieldError(fields);

      const siteIds = sites.map((s) => s.siteId);
      await repo.removePartsOfKinds(tx, siteIds, HEALING_KINDS, body.deliveredOn);
      await retirePreviousRestorations(tx, row.id, siteIds, body.deliveredOn);
      await repo.installParts(
        tx,
        body.parts.map((p) => ({
          practiceId: row.practiceId,
          patientId: row.patientId,
          siteId: p.siteId,
          restorationId: row.id,
          // The part as the catalogue describes it today: a delivery is new work (ADR 0006).
          componentId: catalogue.get(p.componentId)?.id ?? p.componentId,
          lot: p.lot,
          installedOn: body.deliveredOn,
          recordedBy: user.id,
        })),
      );
      await repo.markDelivered(tx, row.id, siteIds, {
        deliveredOn: body.deliveredOn,
        impressionTakenOn: body.impressionTakenOn ?? row.impressionTakenOn,
      });
    });
    return this.detail(ability, scope, row.id);
  }

  /** The practice's cantilever limit, which the planner computes its live Findings with. */
  cantileverSettings(scope: Scope): Promise<CantileverSettings> {
    return cantileverSettings.read(this.db, scope.practiceId);
  }

  setCantileverSettings(scope: Scope, cantileverRatioLimit: number): Promise<CantileverSettings> {
    return cantileverSettings.change(this.db, scope.practiceId, { cantileverRatioLimit });
  }

  /** For the lab prescription (exported to LabPrescriptionsModule): the version, if the user may see its patient. */
  findVisible(scope: Scope, id: string): Promise<repo.RestorationRow | null> {
    return repo.findVisibleRestoration(this.db, scope, id);
  }

  /** What the lab prescription of a visible version lists: its patient, and its sites with the chosen parts. */
  async labSheet(scope: Scope, r: { id: string; patientId: string }) {
    const patient = await repo.findVisiblePatientBrief(this.db, scope, r.patientId);
    const { sites, parts } = await repo.loadRestorationSites(this.db, [r.id]);
    return { patient, sites: sites.map((s) => ({ ...s, parts: parts.filter((p) => p.restorationSiteId === s.id) })) };
  }

  /** The lab prescriptions of restoration versions, newest first, each with its latest e-mail request. */
  async labPrescriptionsOf(restorationIds: string[]): Promise<(LabPrescriptionSummary & { restorationId: string })[]> {
    const labs = await repo.loadLabPrescriptions(this.db, restorationIds);
    const mails = await repo.loadLatestLabMails(
      this.db,
      labs.map((l) => l.id),
    );
    return labs.map((l) => {
      const mail = mails.find((m) => m.labPrescriptionId === l.id);
      return {
        id: l.id,
        restorationId: l.restorationId,
        number: l.number,
        sizeBytes: l.sizeBytes,
        emailedTo: l.emailedTo,
        emailedAt: l.emailedAt?.toISOString() ?? null,
        lastEmail: mail
          ? { to: mail.to, status: mail.status, attempts: mail.attempts, requestedAt: mail.requestedAt.toISOString() }
          : null,
        createdAt: l.createdAt.toISOString(),
      };
    });
  }

  /** Builds the replies for several restorations with a fixed number of queries. */
  async details(rows: repo.RestorationRow[]): Promise<RestorationDetail[]> {
    const ids = rows.map((r) => r.id);
    const [{ sites, parts }, acks, labs] = await Promise.all([
      repo.loadRestorationSites(this.db, ids),
      repo.loadAcknowledgements(this.db, ids),
      this.labPrescriptionsOf(ids),
    ]);
    return rows.map((r) => ({
      id: r.id,
      patientId: r.patientId,
      kind: r.kind,
      retention: r.retention,
      material: r.material,
      shade: r.shade,
      status: r.status,
      copingsSplinted: r.copingsSplinted,
      impressionTakenOn: r.impressionTakenOn,
      deliveredOn: r.deliveredOn,
      labName: r.labName,
      labEmail: r.labEmail,
      dueOn: r.dueOn,
      notes: r.notes,
      findings: r.findings as RestorationDetail['findings'],
      rulesVersion: r.rulesVersion,
      plannedByName: r.plannedByName,
      createdAt: r.createdAt.toISOString(),
      supersedesId: r.supersedesId,
      amendmentReason: r.amendmentReason,
      supersededById: r.supersededById,
      provisional: r.provisional,
      plannedReplacementOn: r.plannedReplacementOn,
      replacedById: r.replacedById,
      cantileverLeftMm: r.cantileverLeftMm,
      cantileverRightMm: r.cantileverRightMm,
      apSpreadMm: r.apSpreadMm,
      retrievable: isRetrievable(r.retention),
      acknowledgements: acks
        .filter((a) => a.restorationId === r.id)
        .map((a) => ({ code: a.code, fdi: a.fdi, byName: a.byName, at: a.at.toISOString() })),
      labPrescriptions: labs.filter((l) => l.restorationId === r.id).map(({ restorationId: _r, ...l }) => l),
      sites: sites
        .filter((s) => s.restorationId === r.id)
        .map((s) => ({
          siteId: s.siteId,
          fdi: s.fdi,
          universal: fdiToUniversal(s.fdi),
          interface: s.interface,
          impressionCoping: s.impressionCoping,
          multiUnitAngleDeg: s.multiUnitAngleDeg,
          restorativeSpaceMm: s.restorativeSpaceMm,
          axis: s.axisX !== null && s.axisY !== null && s.axisZ !== null ? [s.axisX, s.axisY, s.axisZ] : null,
          systemName: s.systemName,
          platformName: s.platformName,
          connection: s.connection,
          components: parts.filter((p) => p.restorationSiteId === s.id).map(({ restorationSiteId: _r, ...p }) => p),
        })),
    }));
  }
}
