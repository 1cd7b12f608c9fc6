import { udiFacts } from '../common/udi-facts.js';
import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import {
  type DateFormat,
  STACK_ORDER,
  type SiteFile,
  type TimelineKind,
  type TimelineReply,
} from '@torquetrail/contracts';
import { isRetrievable, retorqueDueAt, seatingTorqueMissing } from '@torquetrail/domain';
import { assertCan, type Scope } from '../authz/scope.js';
import { datePrinter } from '../common/printed-dates.js';
import { DB, type Database } from '../db/database.js';
import { InsertChangesService } from '../insert-changes/insert-changes.service.js';
import { MaintenanceStatusService } from '../recalls/maintenance-status.service.js';
import {
  currentTorqueOfSite,
  deliverySeatingOfSite,
  findCurrentPlacement,
  findCurrentRestoration,
  findVisibleSite,
  listCurrentParts,
} from './sites.repository.js';
import { buildTimeline } from './timeline.js';
import * as timeline from './timeline.repository.js';

type ReadableType =
  | 'Placement'
  | 'ComponentInstance'
  | 'Restoration'
  | 'TorqueEvent'
  | 'Complication'
  | 'RecallExam'
  | 'Radiograph'
  | 'ReferralSummary'
  | 'Impression'
  | 'InsertChange';

@Injectable()
export class SitesService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly maintenance: MaintenanceStatusService,
    private readonly insertChanges: InsertChangesService,
  ) {}

  private async visible(ability: AppAbility, scope: Scope, siteId: string) {
    const site = assertCan(
      ability,
      'read',
      'ImplantSite',
      await findVisibleSite(this.db, scope, siteId),
      'implant site',
    );
    const rowScope = { practiceId: site.practiceId, patientId: site.patientId, siteId: site.id };
    const canRead = (type: ReadableType) => ability.can('read', subject(type, { ...rowScope }));
    return { site, canRead };
  }

  /** The Site file: header, placement and the Stack, with the last torque and any re-torque due. */
  async siteFile(ability: AppAbility, scope: Scope, siteId: string): Promise<SiteFile> {
    const { site, canRead } = await this.visible(ability, scope, siteId);
    const readParts = canRead('ComponentInstance');
    const readTorque = canRead('TorqueEvent') && readParts;
    const readRestoration = canRead('Restoration');
    // Everything after the access check in one round of parallel reads, each keyed by the site.
    // Insert changes are the practice's own follow-up: absent (not null) where the reader may not see them.
    const readInserts = canRead('InsertChange');
    const [placement, parts, restoration, torque, seatings, latestExam, insertChanges] = await Promise.all([
      canRead('Placement') ? findCurrentPlacement(this.db, site.id) : null,
      readParts ? listCurrentParts(this.db, site.id) : [],
      readRestoration ? findCurrentRestoration(this.db, site.id) : null,
      readTorque ? currentTorqueOfSite(this.db, site.id) : [],
      readRestoration ? deliverySeatingOfSite(this.db, site.id) : [],
      canRead('RecallExam') ? this.maintenance.latestBySite([site.id]) : null,
      readInserts ? this.insertChanges.ofSite(site.id, site.practiceId) : null,
    ]);
    // Oldest first, so the last entry of a part is its latest.
    const lastTorque = new Map(torque.map((t) => [t.instanceId, t]));
    parts.sort((a, b) => STACK_ORDER.indexOf(a.kind) - STACK_ORDER.indexOf(b.kind));

    return {
      id: site.id,
      patientId: site.patientId,
      patientName: site.patientName,
      fdi: site.fdi,
      status: site.status,
      maintenanceStatus: latestExam?.get(site.id)?.status ?? 'not-examined',
      placement: placement && { ...placement, ...udiFacts(placement.udi) },
      parts: parts.map(({ latest, ...part }) => {
        const last = lastTorque.get(part.instanceId);
        return {
          ...part,
          newerVersion:
            latest.id !== part.componentId
              ? {
                  componentId: latest.id,
                  name: latest.name,
                  torqueSpecNcm: latest.torqueSpecNcm,
                  tolerancePct: latest.tolerancePct,
                  versionedAt: latest.versionedAt.toISOString(),
                }
              : null,
          seatingTorqueMissing: readTorque
            ? seatingTorqueMissing(
                part.torqueSpecNcm,
                torque.filter((t) => t.instanceId === part.instanceId),
              )
            : undefined,
          retorqueDueAt:
            readTorque && part.torqueSpecNcm !== null
              ? retorqueDueAt(torque.filter((t) => t.instanceId === part.instanceId))
              : null,
          lastTorque: last
            ? {
                id: last.id,
                appliedNcm: last.appliedNcm,
                specNcm: last.specNcm,
                tolerancePct: last.tolerancePct,
                verdict: last.verdict,
                reason: last.reason,
                performedAt: last.performedAt.toISOString(),
                wrenchCalibrationOverdue: last.wrenchCalibrationOverdue,
              }
            : null,
        };
      }),
      restoration: restoration
        ? {
            ...restoration,
            retrievable: isRetrievable(restoration.retention),
            seating: restoration.deliveredOn
              ? (seatings.find((s) => s.restorationId === restoration.id)?.seating ?? null)
              : null,
          }
        : null,
      ...(readInserts ? { insertChanges } : {}),
    };
  }

  /** Every event of the site in time order, each kind only where the role may read it. */
  /** The Timeline of a site, its words' dates in the reader's practice's order (`dateFormat`). */
  async timeline(
    ability: AppAbility,
    scope: Scope,
    siteId: string,
    kinds: TimelineKind[] | undefined,
    dateFormat: DateFormat,
  ): Promise<TimelineReply> {
    const { site, canRead } = await this.visible(ability, scope, siteId);
    const none = Promise.resolve([] as never[]);
    const readRadiographs = canRead('Radiograph');
    const [
      placements,
      restorations,
      parts,
      torque,
      complications,
      recallExams,
      radiographs,
      measurements,
      seatingChecks,
      referralSummaries,
      passportMails,
      freeTextParts,
      impressions,
      insertChanges,
    ] = await Promise.all([
      canRead('Placement') ? timeline.placementsOfSite(this.db, site.id) : none,
      canRead('Restoration') ? timeline.restorationsOfSite(this.db, site.id) : none,
      canRead('ComponentInstance') ? timeline.partsOfSite(this.db, site.id) : none,
      canRead('TorqueEvent') ? timeline.torqueEventsOfSite(this.db, site.id) : none,
      canRead('Complication') ? timeline.complicationsOfSite(this.db, site.id) : none,
      canRead('RecallExam') ? timeline.recallExamsOfSite(this.db, site.id) : none,
      readRadiographs ? timeline.radiographsOfSite(this.db, site.id) : none,
      readRadiographs ? timeline.measurementsOfSite(this.db, site.id) : none,
      readRadiographs && canRead('Restoration') ? timeline.seatingChecksOfSite(this.db, site.id) : none,
      canRead('ReferralSummary') ? timeline.referralSummariesOfSite(this.db, site.id) : none,
      timeline.passportMailsOfSite(this.db, site.id),
      canRead('ComponentInstance') ? timeline.freeTextPartsOfSite(this.db, site.id) : none,
      // Impressions are the practice's (no share opens them): the ability decides, as for the route.
      canRead('Impression') ? timeline.impressionsOfSite(this.db, site.id) : none,
      canRead('InsertChange') ? this.insertChanges.timelineRowsOfSite(site.id) : none,
    ]);
    const ids = [placements, restorations, parts, torque, recallExams, freeTextParts].flatMap((rows) =>
      rows.map((r: { id: string }) => r.id),
    );
    const importMarks = await timeline.importMarksOf(this.db, ids);
    return buildTimeline(
      site.id,
      {
        placements,
        restorations,
        parts,
        torque,
        complications,
        recallExams,
        radiographs,
        measurements,
        seatingChecks,
        referralSummaries,
        passportMails,
        freeTextParts,
        impressions,
        insertChanges,
        importMarks,
      },
      kinds,
      datePrinter(dateFormat),
    );
  }
}
