import { ConflictException, Inject, Injectable, NotFoundException } from '@nestjs/common';
import { type AppAbility, subject } from '@torquetrail/authz';
import {
  SeatingAmendmentBody,
  type SeatingCheck,
  type SeatingCheckBody,
  type SeatingCheckListReply,
  type SeatingEvent,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { assertAmendable } from '../common/amendment-conflict.js';
import { reportChange } from '../common/audit-context.js';
import { keepAbsent } from '../common/keep-absent.js';
import { fieldError } from '../common/field-error.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { datePrinter } from '../common/printed-dates.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import * as repo from './seating.repository.js';

type Restoration = NonNullable<Awaited<ReturnType<typeof repo.findVisibleRestoration>>>;

const toCheck = (c: repo.SeatingCheckRow): SeatingCheck => ({
  id: c.id,
  restorationId: c.restorationId,
  event: c.event,
  radiographId: c.radiographId,
  radiographTakenOn: c.radiographTakenOn,
  radiographEnteredInError: c.radiographEnteredInError,
  seated: c.seated,
  note: c.note,
  recordedBy: c.recordedByName,
  recordedAt: c.recordedAt.toISOString(),
  supersedesId: c.supersedesId,
  amendmentReason: c.amendmentReason,
  current: c.supersededById === null,
});

const alreadyRecorded = (event: SeatingEvent) =>
  new ConflictException(`The seating at this ${event} is already recorded; amend that check instead`);

/**
 * Seating checks: the dentist attaches one of the patient's radiographs to a restoration's
 * delivery or impression with the answer (seated yes / no / unsure). Writing one needs the right
 * to write restorations, so a hygienist (who files radiographs) may not, nor a surgeon.
 */
@Injectable()
export class SeatingService {
  constructor(@Inject(DB) private readonly db: Database) {}

  async list(ability: AppAbility, scope: Scope, restorationId: string): Promise<SeatingCheckListReply> {
    const r = assertCan(
      ability,
      'read',
      'Restoration',
      await repo.findVisibleRestoration(this.db, scope, restorationId),
      'restoration',
    );
    const rows = await repo.checksOfRestorations(this.db, [r.id]);
    return { items: rows.map(toCheck) };
  }

  async record(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    restorationId: string,
    body: z.output<typeof SeatingCheckBody>,
  ): Promise<SeatingCheck> {
    const r = assertCan(
      ability,
      'create',
      'Restoration',
      await repo.findVisibleRestoration(this.db, scope, restorationId),
      'restoration',
    );
    if (!r.current) {
      throw new ConflictException(
        'This version of the restoration was amended; confirm seating on its current version',
      );
    }
    await this.checkRadiograph(ability, scope, r, body.event, body.radiographId, user);
    if (await repo.firstCheckOf(this.db, r.id, body.event)) throw alreadyRecorded(body.event);
    let id: string;
    try {
      id = await auditedTransaction(this.db, async (tx) => {
        const newId = await repo.insertCheck(tx, {
          practiceId: r.practiceId,
          patientId: r.patientId,
          restorationId: r.id,
          event: body.event,
          radiographId: body.radiographId,
          seated: body.seated,
          note: body.note,
          recordedBy: user.id,
        });
        reportChange({ type: 'SeatingCheck', id: newId, patientId: r.patientId, after: body });
        return newId;
      });
    } catch (e) {
      // Two first checks of one event raced: the partial unique index decided.
      if (isUniqueViolation(e, 'seating_checks_first_unique')) throw alreadyRecorded(body.event);
      throw e;
    }
    return this.check(scope, id);
  }

  async amend(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    checkId: string,
    body: z.output<typeof SeatingAmendmentBody>,
  ): Promise<SeatingCheck> {
    const c = assertAmendable(
      ability,
      'Restoration',
      await repo.findCheck(this.db, scope, checkId),
      'seating check',
      'seating_checks',
    );
    const r = await repo.findVisibleRestoration(this.db, scope, c.restorationId);
    if (!r) throw new NotFoundException('No such seating check');
    // What the amendment leaves out stays as it was.
    const next = keepAbsent(SeatingAmendmentBody, body, c);
    await this.checkRadiograph(ability, scope, r, c.event, next.radiographId, user);
    const id = await auditedTransaction(this.db, async (tx) => {
      const newId = await repo.insertCheckAmendment(tx, {
        practiceId: c.practiceId,
        patientId: c.patientId,
        restorationId: c.restorationId,
        event: c.event,
        radiographId: next.radiographId,
        seated: next.seated,
        note: next.note,
        recordedBy: user.id,
        supersedesId: c.id,
        amendmentReason: body.reason,
      });
      reportChange({
        type: 'SeatingCheck',
        id: newId,
        patientId: c.patientId,
        before: { radiographId: c.radiographId, seated: c.seated, note: c.note },
        after: { radiographId: next.radiographId, seated: next.seated, note: next.note },
      });
      return newId;
    });
    return this.check(scope, id);
  }

  /**
   * The event must have happened, and the radiograph must be this patient's, not entered in error,
   * show one of the restoration's sites (when it names any) and not be older than the event.
   */
  private async checkRadiograph(
    ability: AppAbility,
    scope: Scope,
    r: Restoration,
    event: SeatingEvent,
    radiographId: string,
    user: SessionUser,
  ): Promise<void> {
    const eventOn = event === 'delivery' ? r.deliveredOn : r.impressionTakenOn;
    if (!eventOn) {
      throw fieldError({
        event:
          event === 'delivery'
            ? 'This restoration has not been delivered yet'
            : 'No impression is recorded for this restoration',
      });
    }
    const x = await repo.findVisibleRadiograph(this.db, scope, radiographId);
    if (!x || x.patientId !== r.patientId || !ability.can('read', subject('Radiograph', { ...x }))) {
      throw fieldError({ radiographId: "Choose one of this patient's radiographs" });
    }
    if (x.enteredInErrorAt) {
      throw fieldError({ radiographId: 'This radiograph is marked entered in error; choose another' });
    }
    if (x.siteIds.length > 0 && !x.siteIds.some((s) => r.siteIds.includes(s))) {
      throw fieldError({
        radiographId: "This radiograph shows none of this restoration's sites; choose one that does",
      });
    }
    if (x.takenOn && x.takenOn < eventOn) {
      // Dates in the signed-in user's practice's order (issue 15 §7).
      const dates = datePrinter(user.dateFormat);
      throw fieldError({
        radiographId: `This radiograph was taken on ${dates.date(x.takenOn)}, before the ${event} on ${dates.date(eventOn)}; choose one taken on or after it`,
      });
    }
  }

  private async check(scope: Scope, id: string): Promise<SeatingCheck> {
    const c = await repo.findCheck(this.db, scope, id);
    if (!c) throw new NotFoundException('No such seating check');
    return toCheck(c);
  }
}
