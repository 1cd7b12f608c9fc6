import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import type { SiteFile, TimelineKind, TimelineReply } from '@torquetrail/contracts';
import { RETIGHTEN_AFTER_MINUTES } from '@torquetrail/domain';
import { assertCan, type Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import { MaintenanceStatusService } from '../recalls/maintenance-status.service.js';
import {
  findCurrentPlacement,
  findCurrentRestoration,
  findVisibleSite,
  latestTorqueByInstance,
  listCurrentParts,
  torqueReasonsByInstance,
} from './sites.repository.js';
import { buildTimeline } from './timeline.js';
import * as timeline from './timeline.repository.js';

/** The Stack from the implant outward: abutment or multi-unit, then its screws, then the rest. */
const STACK_ORDER = ['multi-unit-abutment', 'abutment-stock', 'abutment-custom', 'abutment-angled', 'abutment-screw', 'prosthetic-screw', 'set-screw', 'healing-abutment', 'cover-screw', 'impression-coping'];

type ReadableType = 'Placement' | 'ComponentInstance' | 'Restoration' | 'TorqueEvent' | 'Complication' | 'RecallExam';

/**
 * When the re-torque after an initial seating is due, if it has not been logged: the latest
 * initial seating + RETIGHTEN_AFTER_MINUTES (Siamos et al. 2002), until a re-torque follows it.
 */
export function retorqueDueAt(entries: { reason: string; performedAt: Date }[]): string | null {
  const seating = entries.filter((e) => e.reason === 'initial-seating' || e.reason === 'screw-replaced').at(-1);
  if (!seating) return null;
  const retorqued = entries.some((e) => (e.reason === 're-torque-after-settling' || e.reason === 're-torque-at-recall') && e.performedAt >= seating.performedAt);
  return retorqued ? null : new Date(seating.performedAt.getTime() + RETIGHTEN_AFTER_MINUTES * 60_000).toISOString();
}

@Injectable()
export class SitesService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly maintenance: MaintenanceStatusService,
  ) {}

  private async visible(ability: AppAbility, scope: Scope, siteId: string) {
    const site = assertCan(ability, 'read', 'ImplantSite', await findVisibleSite(this.db, scope, siteId), 'implant site');
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
    const [torque, history] = readTorque ? await Promise.all([latestTorqueByInstance(this.db, ids), torqueReasonsByInstance(this.db, ids)]) : [new Map(), []];
    parts.sort((a, b) => STACK_ORDER.indexOf(a.kind) - STACK_ORDER.indexOf(b.kind));

    return {
      id: site.id,
      patientId: site.patientId,
      patientName: site.patientName,
      fdi: site.fdi,
      status: site.status,
      maintenanceStatus: (canRead('RecallExam') ? (await this.maintenance.latestBySite([site.id])).get(site.id)?.status : undefined) ?? 'not-examined',
      placement,
      parts: parts.map((part) => {
        const last = torque.get(part.instanceId);
        return {
          ...part,
          retorqueDueAt: readTorque && part.torqueSpecNcm !== null ? retorqueDueAt(history.filter((h) => h.instanceId === part.instanceId)) : null,
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
      restoration: restoration ? { ...restoration, retrievable: restoration.retention !== 'cement-on-abutment' } : null,
    };
  }

  /** Every event of the site in time order, each kind only where the role may read it. */
  async timeline(ability: AppAbility, scope: Scope, siteId: string, kinds?: TimelineKind[]): Promise<TimelineReply> {
    const { site, canRead } = await this.visible(ability, scope, siteId);
    const none = Promise.resolve([] as never[]);
    const [placements, restorations, parts, torque, complications, recallExams] = await Promise.all([
      canRead('Placement') ? timeline.placementsOfSite(this.db, site.id) : none,
      canRead('Restoration') ? timeline.restorationsOfSite(this.db, site.id) : none,
      canRead('ComponentInstance') ? timeline.partsOfSite(this.db, site.id) : none,
      canRead('TorqueEvent') ? timeline.torqueEventsOfSite(this.db, site.id) : none,
      canRead('Complication') ? timeline.complicationsOfSite(this.db, site.id) : none,
      canRead('RecallExam') ? timeline.recallExamsOfSite(this.db, site.id) : none,
    ]);
    return buildTimeline(site.id, { placements, restorations, parts, torque, complications, recallExams }, kinds);
  }
}
