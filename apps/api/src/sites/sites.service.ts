import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import { STACK_ORDER, type SiteFile, type TimelineKind, type TimelineReply } from '@torquetrail/contracts';
import { isRetrievable, retorqueDueAt } from '@torquetrail/domain';
import { assertCan, type Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import { MaintenanceStatusService } from '../recalls/maintenance-status.service.js';
import {
  deliverySeating,
  findCurrentPlacement,
  findCurrentRestoration,
  findVisibleSite,
  latestTorqueByInstance,
  listCurrentParts,
  torqueReasonsByInstance,
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
  | 'Radiograph';

@Injectable()
export class SitesService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly maintenance: MaintenanceStatusService,
  ) {}

  private async visible(ability: AppAbility, scope: Scope, siteId: string) {
    const site = assertCan(
      ability,
      'read',
      'ImplantSite',
      await findVisibleSite(this.db, scope, siteId),
      'implant site',
    );
    const rowScope = { practiceId: site.practiceId, patientId: site.patientId };
    const canRead = (type: ReadableType) => ability.can('read', subject(type, { ...rowScope }));
    return { site, canRead };
  }

  /** The Site file: header, placement and the Stack, with the last torque and any re-torque due. */
  async siteFile(ability: AppAbility, scope: Scope, siteId: string): Promise<SiteFile> {
    const { site, canRead } = await this.visible(ability, scope, siteId);
    const [placement, parts, restoration] = await Promise.all([
      canRead('Placement') ? findCurrentPlacement(this.db, site.id) : null,
      canRead('ComponentInstance') ? listCurrentParts(this.db, site.id) : [],
      canRead('Restoration') ? findCurrentRestoration(this.db, site.id) : null,
    ]);
    const ids = parts.map((p) => p.instanceId);
    const readTorque = canRead('TorqueEvent');
    const [torque, history] = readTorque
      ? await Promise.all([latestTorqueByInstance(this.db, ids), torqueReasonsByInstance(this.db, ids)])
      : [new Map(), []];
    parts.sort((a, b) => STACK_ORDER.indexOf(a.kind) - STACK_ORDER.indexOf(b.kind));

    return {
      id: site.id,
      patientId: site.patientId,
      patientName: site.patientName,
      fdi: site.fdi,
      status: site.status,
      maintenanceStatus:
        (canRead('RecallExam') ? (await this.maintenance.latestBySite([site.id])).get(site.id)?.status : undefined) ??
        'not-examined',
      placement,
      parts: parts.map(({ latest, ...part }) => {
        const last = torque.get(part.instanceId);
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
          retorqueDueAt:
            readTorque && part.torqueSpecNcm !== null
              ? retorqueDueAt(history.filter((h) => h.instanceId === part.instanceId))
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
              }
            : null,
        };
      }),
      restoration: restoration
        ? {
            ...restoration,
            retrievable: isRetrievable(restoration.retention),
            seating: restoration.deliveredOn ? await deliverySeating(this.db, restoration.id) : null,
          }
        : null,
    };
  }

  /** Every event of the site in time order, each kind only where the role may read it. */
  async timeline(ability: AppAbility, scope: Scope, siteId: string, kinds?: TimelineKind[]): Promise<TimelineReply> {
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
      freeTextParts,
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
      canRead('ComponentInstance') ? timeline.freeTextPartsOfSite(this.db, site.id) : none,
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
        freeTextParts,
        importMarks,
      },
      kinds,
    );
  }
}
