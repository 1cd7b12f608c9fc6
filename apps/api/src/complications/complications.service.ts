import { Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import { type Complication, ComplicationAmendmentBody, type ComplicationBody } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { assertAmendable } from '../common/amendment-conflict.js';
import { keepAbsent } from '../common/keep-absent.js';
import { fieldError } from '../common/field-error.js';
import { DB, type Database } from '../db/database.js';
import * as repo from './complications.repository.js';

@Injectable()
export class ComplicationsService {
  constructor(@Inject(DB) private readonly db: Database) {}

  private async checkPart(siteId: string, componentInstanceId: string | null) {
    if (!componentInstanceId) return;
    if (!(await repo.findPartAtSite(this.db, siteId, componentInstanceId)))
      throw fieldError({ componentInstanceId: 'Not a part at this site' });
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
      site ? { practiceId: site.practiceId, patientId: site.patientId } : null,
      'implant site',
    );
    this.checkDate(body.occurredOn);
    await this.checkPart(body.siteId, body.componentInstanceId);
    const id = await repo.insertComplication(this.db, {
      practiceId: site.practiceId,
      patientId: site.patientId,
      siteId: site.id,
      componentInstanceId: body.componentInstanceId,
      kind: body.kind,
      occurredOn: body.occurredOn,
      notes: body.notes,
      recordedBy: user.id,
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
    const newId = await repo.insertComplicationAmendment(this.db, {
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
    });
    return repo.loadComplication(this.db, newId);
  }
}
