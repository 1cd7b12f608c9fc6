import { ConflictException, Inject, Injectable, NotFoundException } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { ScanBodyMarker, ScanBodyMarkerBody, ScanBodyMarkerListReply } from '@torquetrail/contracts';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import * as impressions from './impressions.repository.js';
import * as repo from './scan-body-markers.repository.js';

type Point = { x: number; y: number; z: number };
const pointOf = (m: { x: number | null; y: number | null; z: number | null }): Point | null =>
  m.x === null || m.y === null || m.z === null ? null : { x: m.x, y: m.y, z: m.z };

const toMarker = (m: repo.MarkerRow): ScanBodyMarker => ({
  id: m.id,
  scanFileId: m.scanFileId,
  siteId: m.siteId,
  fdi: m.fdi,
  point: pointOf(m),
  placedBy: m.placedByName,
  placedAt: m.placedAt.toISOString(),
  supersedesId: m.supersedesId,
  amendmentReason: m.amendmentReason,
});

const alreadyPlaced = () =>
  new ConflictException('A marker was just placed for this scan body; reload the markers and move it instead');

/**
 * Markers of the recorded scan bodies on a scan file: where each one stands on the mesh, picked by
 * the clinician (a mesh file names no parts). Read by everyone who may read the impression; placed,
 * moved and cleared by those who may record it (the `Impression` subject), each change a new row
 * superseding the last (never overwritten), audited with the point before and after.
 */
@Injectable()
export class ScanBodyMarkersService {
  constructor(@Inject(DB) private readonly db: Database) {}

  async list(ability: AppAbility, scope: Scope, scanFileId: string): Promise<ScanBodyMarkerListReply> {
    const file = assertCan(
      ability,
      'read',
      'Impression',
      await impressions.findScanFile(this.db, scope, scanFileId),
      'scan file',
    );
    return { items: (await repo.currentMarkers(this.db, file.id)).map(toMarker) };
  }

  async save(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    scanFileId: string,
    body: ScanBodyMarkerBody,
  ): Promise<ScanBodyMarker> {
    const file = assertCan(
      ability,
      'create',
      'Impression',
      await impressions.findScanFile(this.db, scope, scanFileId),
      'scan file',
    );
    const fdi = await this.recordedSite(file, body.siteId);
    const before = await repo.currentMarkerAt(this.db, file.id, body.siteId);
    const was = before && pointOf(before);
    if (!was && body.point === null) throw fieldError({ point: `No marker is placed at site ${fdi} to clear` });
    let id: string;
    try {
      id = await auditedTransaction(this.db, async (tx) => {
        const values = {
          practiceId: file.practiceId,
          patientId: file.patientId,
          scanFileId: file.id,
          siteId: body.siteId,
          x: body.point?.x ?? null,
          y: body.point?.y ?? null,
          z: body.point?.z ?? null,
          placedBy: user.id,
        };
        const newId = before
          ? await repo.insertMarkerAmendment(tx, {
              ...values,
              supersedesId: before.id,
              amendmentReason: body.point ? (was ? 'Moved on the mesh' : 'Placed again') : 'Cleared',
            })
          : await repo.insertMarker(tx, values);
        reportChange({
          type: 'ScanBodyMarker',
          id: newId,
          patientId: file.patientId,
          before: before ? { fdi, point: was } : undefined,
          after: { scanFileId: file.id, fdi, point: body.point },
        });
        return newId;
      });
    } catch (e) {
      if (isUniqueViolation(e, 'scan_body_markers_first_unique')) throw alreadyPlaced();
      throw e;
    }
    const saved = await repo.findMarker(this.db, id);
    if (!saved) throw new NotFoundException('No such marker');
    return toMarker(saved);
  }

  /**
   * The chart number of the site, which must carry a scan body in the restoration's current
   * impression: a marker names a recorded scan body, nothing else. 400 naming the site otherwise.
   */
  private async recordedSite(file: impressions.ScanFileRow, siteId: string): Promise<number> {
    const current = (await impressions.impressionsOfRestoration(this.db, file.restorationId)).find(
      (i) => i.supersededById === null,
    );
    const bodies = current ? await impressions.scanBodiesOf(this.db, [current.id]) : [];
    const recorded = bodies.find((b) => b.siteId === siteId);
    if (recorded) return recorded.fdi;
    const site = await repo.siteOfPatient(this.db, file.patientId, siteId);
    throw fieldError({
      siteId: site
        ? `No scan body is recorded at site ${site.fdi} in this impression: record it with the impression before marking it on the scan`
        : "Not one of this patient's sites",
    });
  }
}
