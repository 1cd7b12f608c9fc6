import { Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { type Complication, ComplicationAmendmentBody, type ComplicationBody } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { assertAmendable } from '../common/amendment-conflict.js';
import { keepAbsent } from '../common/keep-absent.js';
import { fieldError } from '../common/field-error.js';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import * as repo from './complications.repository.js';

@Injectable()
export class ComplicationsService {
  constructor(@Inject(DB) private readonly db: Database) {}

  private async checkPart(siteId: string, componentInstanceId: string | null) {
    if (!componentInstanceId) return;
    const part = await repo.findPartAtSite(this.db, siteId, componentInstanceId);
    if (!part) throw fieldError({ componentInstanceId: 'Not a part at this site' });
    // A part entered in error was never fitted: nothing can have happened to it.
    if (part.enteredInErrorAt)
      throw fieldError({ componentInstanceId: 'This part was entered in error: choose the part that was fitted' });
  }

  private checkDate(occurredOn: string) {
    if (occurredOn > new Date().toISOString().slice(0, 10)) throw fieldError({ occurredOn: 'Cannot be in the future' });
  }

  async create(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    body: z.output<typeof ComplicationBody>,
  ): Promise<Complication> {
    const site = await repo.findVisibleSite(this.db, scope, body.siteId);
    assertCan(
      ability,
      'create',
      'Complication',
      site ? { practiceId: site.practiceId, patientId: site.patientId, siteId: body.siteId } : null,
      'implant site',
    );
    this.checkDate(body.occurredOn);
    await this.checkPart(body.siteId, body.componentInstanceId);
    const values = {
      practiceId: site.practiceId,
      patientId: site.patientId,
      siteId: site.id,
      componentInstanceId: body.componentInstanceId,
      kind: body.kind,
      occurredOn: body.occurredOn,
      notes: body.notes,
      recordedBy: user.id,
    };
    const id = await auditedTransaction(this.db, async (tx) => {
      const newId = await repo.insertComplication(tx, values);
      reportChange({ type: 'Complication', id: newId, patientId: site.patientId, after: values });
      return newId;
    });
    return repo.loadComplication(this.db, id);
  }

  /** A new version superseding the old entry; the old one stays, marked as amended. */
  async amend(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: z.output<typeof ComplicationAmendmentBody>,
  ): Promise<Complication> {
    const found = assertAmendable(
      ability,
      'Complication',
      await repo.findVisibleComplication(this.db, scope, id),
      'complication',
      'complications',
    );
    // What the amendment does not name stays as it was.
    const { amendmentReason: _reason, ...changes } = body;
    const next = keepAbsent(ComplicationAmendmentBody, changes, found);
    if (body.occurredOn !== undefined) this.checkDate(next.occurredOn);
    if (body.componentInstanceId !== undefined) await this.checkPart(found.siteId, next.componentInstanceId);
    // Of two concurrent amendments of one entry the database saves the first (insertAmendment).
    const values = {
      practiceId: found.practiceId,
      patientId: found.patientId,
      siteId: found.siteId,
      componentInstanceId: next.componentInstanceId,
      kind: next.kind,
      occurredOn: next.occurredOn,
      notes: next.notes,
      supersedesId: found.id,
      amendmentReason: body.amendmentReason,
      recordedBy: user.id,
    };
    const newId = await auditedTransaction(this.db, async (tx) => {
      const inserted = await repo.insertComplicationAmendment(tx, values);
      reportChange({ type: 'Complication', id: inserted, patientId: found.patientId, before: found, after: values });
      return inserted;
    });
    return repo.loadComplication(this.db, newId);
  }
}
