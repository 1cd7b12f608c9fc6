import { ConflictException, Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { RestorationScrewsReply, SeatRestorationBody, SeatRestorationReply } from '@torquetrail/contracts';
import { RULES_VERSION, SEATING_REASONS, torqueVerdict } from '@torquetrail/domain';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { assertInPlace, checkWhen, currentWrench, torqueReply } from './torque-checks.js';
import * as repo from './torque.repository.js';

/**
 * Seat restoration: the initial seating torque of every screw of a delivered restoration, with
 * one wrench and one time, saved in one transaction (all or none). Each verdict comes from
 * `torqueVerdict` with that screw's current catalogue spec, as for a single entry.
 */
@Injectable()
export class SeatRestorationService {
  constructor(@Inject(DB) private readonly db: Database) {}

  private async restoration(ability: AppAbility, scope: Scope, id: string) {
    const restoration = assertCan(
      ability,
      'read',
      'Restoration',
      await repo.findVisibleRestoration(this.db, scope, id),
      'restoration',
    );
    const screws = await repo.listRestorationScrews(this.db, restoration.id);
    return { restoration, screws };
  }

  async screws(ability: AppAbility, scope: Scope, id: string): Promise<RestorationScrewsReply> {
    const { restoration, screws } = await this.restoration(ability, scope, id);
    const torque = await repo.currentTorqueOfInstances(
      this.db,
      screws.map((s) => s.instanceId),
    );
    return {
      restorationId: restoration.id,
      deliveredOn: restoration.deliveredOn,
      items: screws.map(({ practiceId: _p, patientId: _q, torqueSpecNcm, ...screw }) => {
        const seatings = torque.filter((t) => t.instanceId === screw.instanceId && SEATING_REASONS.includes(t.reason));
        return {
          ...screw,
          torqueSpecNcm: torqueSpecNcm ?? 0,
          seatedAt: seatings.at(-1)?.performedAt.toISOString() ?? null,
        };
      }),
    };
  }

  async seat(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: z.output<typeof SeatRestorationBody>,
  ): Promise<SeatRestorationReply> {
    const { restoration, screws } = await this.restoration(ability, scope, id);
    if (restoration.status !== 'delivered')
      throw new ConflictException('Only a delivered restoration is seated: record its delivery first');
    const byId = new Map(screws.map((s) => [s.instanceId, s]));
    const seen = new Set<string>();
    body.screws.forEach((s, i) => {
      if (!byId.has(s.componentInstanceId))
        throw fieldError({
          [`screws.${i}.componentInstanceId`]: 'Not a torqued part of this restoration in place',
        });
      if (seen.has(s.componentInstanceId))
        throw fieldError({ [`screws.${i}.componentInstanceId`]: 'This screw is entered twice' });
      seen.add(s.componentInstanceId);
    });
    for (const s of body.screws) assertCan(ability, 'create', 'TorqueEvent', byId.get(s.componentInstanceId), 'part');
    const performedAt = body.performedAt ? new Date(body.performedAt) : new Date();
    checkWhen(performedAt, 'performedAt');
    const wrench = await currentWrench(this.db, restoration.practiceId, body.wrenchId, performedAt);

    const ids = await auditedTransaction(this.db, async (tx) => {
      const saved: string[] = [];
      for (const s of body.screws) {
        const screw = byId.get(s.componentInstanceId)!;
        // Under the lock: a concurrent screw replacement may have retired the part meanwhile.
        await repo.lockInstance(tx, screw.instanceId);
        const now = await repo.findVisibleInstance(tx, scope, screw.instanceId);
        if (!now) throw fieldError({ screws: 'A screw of this restoration is no longer visible' });
        assertInPlace(now, user.dateFormat);
        const specNcm = now.torqueSpecNcm ?? screw.torqueSpecNcm!;
        const values = {
          practiceId: screw.practiceId,
          patientId: screw.patientId,
          componentInstanceId: screw.instanceId,
          appliedNcm: s.appliedNcm,
          specNcm,
          tolerancePct: now.tolerancePct,
          verdict: torqueVerdict({ appliedNcm: s.appliedNcm, specNcm, tolerancePct: now.tolerancePct }),
          rulesVersion: RULES_VERSION,
          reason: 'initial-seating' as const,
          ...wrench,
          performedAt,
          recordedBy: user.id,
        };
        const eventId = await repo.insertTorqueEvent(tx, values);
        reportChange({ type: 'TorqueEvent', id: eventId, patientId: screw.patientId, after: values });
        saved.push(eventId);
      }
      return saved;
    });
    return { items: await Promise.all(ids.map((eventId) => torqueReply(this.db, eventId, false))) };
  }
}
