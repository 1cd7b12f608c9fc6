import { Inject, Injectable } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import type { SiteFile } from '@torquetrail/contracts';
import { assertCan, type Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import {
  findCurrentPlacement,
  findCurrentRestoration,
  findVisibleSite,
  latestTorqueByInstance,
  listCurrentParts,
} from './sites.repository.js';

@Injectable()
export class SitesService {
  constructor(@Inject(DB) private readonly db: Database) {}

  /** The Site file: header, placement and the Stack as recorded so far. */
  async siteFile(ability: AppAbility, scope: Scope, siteId: string): Promise<SiteFile> {
    const site = assertCan(ability, 'read', 'ImplantSite', await findVisibleSite(this.db, scope, siteId), 'implant site');
    const rowScope = { practiceId: site.practiceId, patientId: site.patientId };
    const canRead = (type: 'Placement' | 'ComponentInstance' | 'Restoration' | 'TorqueEvent') =>
      ability.can('read', subject(type, { ...rowScope }));

    const [placement, parts, restoration] = await Promise.all([
      canRead('Placement') ? findCurrentPlacement(this.db, site.id) : null,
      canRead('ComponentInstance') ? listCurrentParts(this.db, site.id) : [],
      canRead('Restoration') ? findCurrentRestoration(this.db, site.id) : null,
    ]);
    const torque = canRead('TorqueEvent') ? await latestTorqueByInstance(this.db, parts.map((p) => p.instanceId)) : new Map();

    return {
      id: site.id,
      patientId: site.patientId,
      patientName: site.patientName,
      fdi: site.fdi,
      status: site.status,
      maintenanceStatus: 'not-examined',
      placement,
      parts: parts.map((part) => {
        const last = torque.get(part.instanceId);
        return {
          ...part,
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
        ? { ...restoration, retrievable: restoration.retention !== 'cement-on-abutment' }
        : null,
    };
  }
}
