import { fitInsert, refitInsert } from '../db/insert-fitting.js';
import { insertReviewSettings } from '../db/practice-settings.js';
import { Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  DENTURE_RETAINER_KINDS,
  type InsertChange,
  InsertChangeAmendmentBody,
  type InsertChangeBody,
  type InsertReviewSettings,
  type SiteInsertChanges,
} from '@torquetrail/contracts';
import { insertChangeSummary, insertReviewDueOn } from '@torquetrail/domain';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { assertAmendable } from '../common/amendment-conflict.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { keepAbsent } from '../common/keep-absent.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { RecallClock } from '../recalls/recall-clock.js';
import * as repo from './insert-changes.repository.js';

type Overdenture = NonNullable<Awaited<ReturnType<typeof repo.findDeliveredOverdenture>>>;

/** The catalogue kinds an overdenture's insert change may name [decision: a bar may carry inserts or clips]. */
const INSERT_KINDS: Record<string, readonly string[]> = {
  'overdenture-studs': ['retentive-insert'],
  'overdenture-bar': DENTURE_RETAINER_KINDS,
};

@Injectable()
export class InsertChangesService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly clock: RecallClock,
  ) {}

  private checkDate(changedOn: string, overdenture: Overdenture) {
    if (changedOn > this.clock.today()) throw fieldError({ changedOn: 'Cannot be in the future' });
    if (changedOn < overdenture.deliveredOn)
      throw fieldError({ changedOn: 'Cannot be before the overdenture was delivered' });
  }

  private async checkPart(
    practiceId: string,
    overdenture: Overdenture,
    field: 'oldComponentId' | 'newComponentId',
    id: string | null,
  ) {
    if (id === null) return;
    const part = await repo.findPart(this.db, practiceId, id);
    const kinds = INSERT_KINDS[overdenture.kind];
    if (!part || !kinds.includes(part.kind))
      throw fieldError({
        [field]:
          overdenture.kind === 'overdenture-bar'
            ? 'Choose a bar clip or retentive insert from the catalogue'
            : 'Choose a retentive insert from the catalogue',
      });
  }

  private async overdentureOf(siteId: string, fdi: number): Promise<Overdenture> {
    const found = await repo.findDeliveredOverdenture(this.db, siteId);
    if (!found)
      throw fieldError({
        siteId: `Site ${fdi} carries no delivered overdenture: insert changes are logged on overdenture sites`,
      });
    return found;
  }

  async create(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    body: z.output<typeof InsertChangeBody>,
  ): Promise<InsertChange> {
    const site = await repo.findVisibleSite(this.db, scope, body.siteId);
    assertCan(
      ability,
      'create',
      'InsertChange',
      site ? { practiceId: site.practiceId, patientId: site.patientId, siteId: body.siteId } : null,
      'implant site',
    );
    if (body.changedOn > this.clock.today()) throw fieldError({ changedOn: 'Cannot be in the future' });
    const overdenture = await this.overdentureOf(site.id, site.fdi);
    this.checkDate(body.changedOn, overdenture);
    await this.checkPart(site.practiceId, overdenture, 'oldComponentId', body.oldComponentId);
    await this.checkPart(site.practiceId, overdenture, 'newComponentId', body.newComponentId);
    const values = {
      practiceId: site.practiceId,
      patientId: site.patientId,
      siteId: site.id,
      restorationId: overdenture.id,
      changedOn: body.changedOn,
      oldComponentId: body.oldComponentId,
      newComponentId: body.newComponentId,
      reason: body.reason,
      notes: body.notes,
      recordedBy: user.id,
    };
    const id = await auditedTransaction(this.db, async (tx) => {
      const newId = await repo.insertInsertChange(tx, values);
      // The Stack shows what is in the mouth: the new insert replaces the one in place.
      await fitInsert(tx, { ...values, insertChangeId: newId, componentId: values.newComponentId });
      reportChange({ type: 'InsertChange', id: newId, patientId: site.patientId, after: values });
      return newId;
    });
    return repo.loadInsertChange(this.db, id);
  }

  /** A new version superseding the old entry; the old one stays, marked as amended. */
  async amend(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: z.output<typeof InsertChangeAmendmentBody>,
  ): Promise<InsertChange> {
    const found = assertAmendable(
      ability,
      'InsertChange',
      await repo.findVisibleInsertChange(this.db, scope, id),
      'insert change',
      'insert_changes',
    );
    // What the amendment does not name stays as it was.
    const { amendmentReason: _reason, ...changes } = body;
    const next = keepAbsent(InsertChangeAmendmentBody, changes, found);
    const overdenture = (await repo.findDeliveredOverdenture(this.db, found.siteId)) ?? null;
    if (overdenture) {
      if (body.changedOn !== undefined) this.checkDate(next.changedOn, overdenture);
      if (body.oldComponentId !== undefined)
        await this.checkPart(found.practiceId, overdenture, 'oldComponentId', next.oldComponentId);
      if (body.newComponentId !== undefined)
        await this.checkPart(found.practiceId, overdenture, 'newComponentId', next.newComponentId);
    } else if (body.changedOn !== undefined && next.changedOn > this.clock.today())
      throw fieldError({ changedOn: 'Cannot be in the future' });
    // Of two concurrent amendments of one entry the database saves the first (insertAmendment).
    const values = {
      practiceId: found.practiceId,
      patientId: found.patientId,
      siteId: found.siteId,
      restorationId: found.restorationId,
      changedOn: next.changedOn,
      oldComponentId: next.oldComponentId,
      newComponentId: next.newComponentId,
      reason: next.reason,
      notes: next.notes,
      supersedesId: found.id,
      amendmentReason: body.amendmentReason,
      recordedBy: user.id,
    };
    const newId = await auditedTransaction(this.db, async (tx) => {
      const inserted = await repo.insertInsertChangeAmendment(tx, values);
      // The Stack follows the amended part and day; a refusal rolls the amendment back with it.
      const problem = await refitInsert(
        tx,
        found.id,
        { ...values, insertChangeId: inserted, componentId: values.newComponentId },
        body.amendmentReason,
      );
      if (problem) throw fieldError(problem);
      reportChange({ type: 'InsertChange', id: inserted, patientId: found.patientId, before: found, after: values });
      return inserted;
    });
    return repo.loadInsertChange(this.db, newId);
  }

  /**
   * For the Site file (SitesService, after its own access check): the site's insert record, or null
   * when the site carries no delivered overdenture.
   */
  async ofSite(siteId: string, practiceId: string): Promise<SiteInsertChanges | null> {
    const overdenture = await repo.findDeliveredOverdenture(this.db, siteId);
    if (!overdenture) return null;
    const today = this.clock.today();
    const [entries, lastOfRestoration, { insertReviewIntervalMonths: months }] = await Promise.all([
      repo.currentChangesOfSite(this.db, siteId),
      repo.lastChangeOfRestoration(this.db, overdenture.id, overdenture.deliveredOn),
      insertReviewSettings.read(this.db, practiceId),
    ]);
    // An entry dated after today (the clock pinned back in a test) is left out of the counts.
    const summary = insertChangeSummary(
      entries.map((e) => e.changedOn).filter((d) => d <= today),
      today,
    );
    const reviewDueOn = insertReviewDueOn(lastOfRestoration ?? overdenture.deliveredOn, months);
    return {
      restorationId: overdenture.id,
      deliveredOn: overdenture.deliveredOn,
      reviewIntervalMonths: months,
      ...summary,
      reviewDueOn,
      reviewOverdue: reviewDueOn < today,
      entries,
    };
  }

  /** For the Timeline (SitesService, after its own access check): every change of the site, amended ones too. */
  timelineRowsOfSite(siteId: string) {
    return repo.allChangesOfSite(this.db, siteId);
  }

  settings(scope: Scope): Promise<InsertReviewSettings> {
    return insertReviewSettings.read(this.db, scope.practiceId);
  }

  setSettings(scope: Scope, insertReviewIntervalMonths: number): Promise<InsertReviewSettings> {
    return insertReviewSettings.change(this.db, scope.practiceId, { insertReviewIntervalMonths });
  }
}
