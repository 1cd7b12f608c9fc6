import { Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { TorqueAmendmentBody, TorqueBody, TorqueEvent } from '@torquetrail/contracts';
import { earlySettlingRetorque, RETIGHTEN_AFTER_MINUTES, RULES_VERSION, torqueVerdict } from '@torquetrail/domain';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { assertAmendable } from '../common/amendment-conflict.js';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { assertInPlace, checkWhen, currentWrench, torqueReply } from './torque-checks.js';
import { fieldError } from '../common/field-error.js';
import * as repo from './torque.repository.js';

const minutesText = (n: number) => (n === 0 ? 'less than a minute' : `${n} minute${n === 1 ? '' : 's'}`);

@Injectable()
export class TorqueService {
  constructor(@Inject(DB) private readonly db: Database) {}

  /**
   * Logs a torque. The verdict comes from `torqueVerdict` with the spec and tolerance of the
   * part's current catalogue version and is stored with RULES_VERSION. 'screw-replaced' retires the old instance
   * (removedOn) and applies the torque to a new one that replaces it, in one transaction.
   */
  async log(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    body: z.output<typeof TorqueBody>,
  ): Promise<TorqueEvent> {
    const part = assertCan(
      ability,
      'create',
      'TorqueEvent',
      await repo.findVisibleInstance(this.db, scope, body.componentInstanceId),
      'part',
    );
    assertInPlace(part, user.dateFormat);
    if (part.torqueSpecNcm === null)
      throw fieldError({
        componentInstanceId: `${part.name} is hand-tight: it has no torque specification in the catalogue`,
      });
    const performedAt = body.performedAt ? new Date(body.performedAt) : new Date();
    checkWhen(performedAt, 'performedAt');
    const wrench = await currentWrench(this.db, part.practiceId, body.wrenchId, performedAt);
    // A settling re-torque earlier than the settling time needs the clinician's confirmation (stored).
    const early = earlySettlingRetorque(
      body.reason,
      performedAt,
      await repo.currentTorqueOfInstances(this.db, [part.id]),
    );
    if (early && !body.confirmEarlySettling)
      throw fieldError({
        confirmEarlySettling: `This re-torque after settling comes ${minutesText(early.minutesAfter)} after the seating, earlier than the about ${RETIGHTEN_AFTER_MINUTES} minutes settling takes (Siamos et al. 2002). Confirm to record it anyway`,
      });
    const replacing = body.reason === 'screw-replaced';
    if (replacing) {
      assertCan(ability, 'create', 'ComponentInstance', part, 'part');
      if (part.requiresLot && !body.replacementLot)
        throw fieldError({ replacementLot: `The lot number of the new ${part.name} is required` });
    }
    const specNcm = part.torqueSpecNcm;
    const verdict = torqueVerdict({ appliedNcm: body.appliedNcm, specNcm, tolerancePct: part.tolerancePct });
    const id = await auditedTransaction(this.db, async (tx) => {
      // Re-read under the lock: a concurrent 'screw-replaced' may have retired the part meanwhile.
      await repo.lockInstance(tx, part.id);
      assertInPlace(await repo.findVisibleInstance(tx, scope, part.id), user.dateFormat);
      let instanceId = part.id;
      if (replacing) {
        const day = performedAt.toISOString().slice(0, 10);
        await repo.retireInstance(tx, part.id, day);
        instanceId = await repo.insertInstance(tx, {
          practiceId: part.practiceId,
          patientId: part.patientId,
          siteId: part.siteId,
          restorationId: part.restorationId,
          componentId: part.currentComponentId,
          lot: body.replacementLot,
          installedOn: day,
          replacesId: part.id,
          recordedBy: user.id,
        });
      }
      const values = {
        practiceId: part.practiceId,
        patientId: part.patientId,
        componentInstanceId: instanceId,
        appliedNcm: body.appliedNcm,
        specNcm,
        tolerancePct: part.tolerancePct,
        verdict,
        rulesVersion: RULES_VERSION,
        reason: body.reason,
        ...wrench,
        earlySettlingConfirmed: early !== null,
        performedAt,
        recordedBy: user.id,
      };
      const eventId = await repo.insertTorqueEvent(tx, values);
      reportChange({ type: 'TorqueEvent', id: eventId, patientId: part.patientId, after: values });
      return eventId;
    });
    return torqueReply(this.db, id, replacing);
  }

  /** An amendment is a new row superseding the old one (spec and reason kept; the verdict recomputed). */
  async amend(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: z.output<typeof TorqueAmendmentBody>,
  ): Promise<TorqueEvent> {
    const old = assertAmendable(
      ability,
      'TorqueEvent',
      await repo.findVisibleTorqueEvent(this.db, scope, id),
      'torque entry',
      'torque_events',
    );
    // What the amendment does not name stays as it was, the wrench included (the version used then).
    const appliedNcm = body.appliedNcm ?? old.appliedNcm;
    const performedAt = body.performedAt === undefined ? old.performedAt : new Date(body.performedAt);
    if (body.performedAt !== undefined) checkWhen(performedAt, 'performedAt');
    // The wrench left out stays the version used then; its calibration is judged on the entry's day.
    const wrench =
      body.wrenchId === undefined
        ? {
            wrenchId: old.wrenchId,
            wrenchCalibrationOverdue: (await currentWrench(this.db, old.practiceId, old.wrenchId, performedAt))
              .wrenchCalibrationOverdue,
          }
        : await currentWrench(this.db, old.practiceId, body.wrenchId, performedAt);
    const verdict = torqueVerdict({
      appliedNcm,
      specNcm: old.specNcm,
      tolerancePct: old.tolerancePct,
    });
    // Of two concurrent amendments of one entry the database saves the first (insertAmendment).
    const values = {
      practiceId: old.practiceId,
      patientId: old.patientId,
      componentInstanceId: old.componentInstanceId,
      appliedNcm,
      specNcm: old.specNcm,
      tolerancePct: old.tolerancePct,
      verdict,
      rulesVersion: RULES_VERSION,
      reason: old.reason,
      ...wrench,
      earlySettlingConfirmed: old.earlySettlingConfirmed,
      performedAt,
      supersedesId: old.id,
      amendmentReason: body.amendmentReason,
      recordedBy: user.id,
    };
    const newId = await auditedTransaction(this.db, async (tx) => {
      const inserted = await repo.insertTorqueAmendment(tx, values);
      reportChange({ type: 'TorqueEvent', id: inserted, patientId: old.patientId, before: old, after: values });
      return inserted;
    });
    return torqueReply(this.db, newId, false);
  }
}
