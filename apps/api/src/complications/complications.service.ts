import { ConflictException, Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { Complication, ComplicationAmendmentBody, ComplicationBody } from '@torquetrail/contracts';
import { and, eq, sql } from 'drizzle-orm';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { DB, type Database, type Db } from '../db/database.js';
import { complications, componentInstances, patients, users } from '../db/schema/index.js';
import { visiblePatients } from '../authz/visible-patients.js';
import { fieldError } from '../common/field-error.js';
import { findVisibleSite } from '../sites/sites.repository.js';
import { supersededById } from '../db/amendments.js';

function assertCurrent(entry: { supersededById: string | null }) {
  if (entry.supersededById) throw new ConflictException('This entry was already amended; amend the current version');
}

@Injectable()
export class ComplicationsService {
  constructor(@Inject(DB) private readonly db: Database) {}

  private async checkPart(siteId: string, componentInstanceId: string | null) {
    if (!componentInstanceId) return;
    const [part] = await this.db.select({ id: componentInstances.id }).from(componentInstances).where(and(eq(componentInstances.id, componentInstanceId), eq(componentInstances.siteId, siteId)));
    if (!part) throw fieldError({ componentInstanceId: 'Not a part at this site' });
  }

  private checkDate(occurredOn: string) {
    if (occurredOn > new Date().toISOString().slice(0, 10)) throw fieldError({ occurredOn: 'Cannot be in the future' });
  }

  async create(ability: AppAbility, user: SessionUser, scope: Scope, body: z.output<typeof ComplicationBody>): Promise<Complication> {
    const site = await findVisibleSite(this.db, scope, body.siteId);
    assertCan(ability, 'create', 'Complication', site ? { practiceId: site.practiceId, patientId: site.patientId } : null, 'implant site');
    this.checkDate(body.occurredOn);
    await this.checkPart(body.siteId, body.componentInstanceId);
    const [row] = await this.db
      .insert(complications)
      .values({ practiceId: site!.practiceId, patientId: site!.patientId, siteId: site!.id, componentInstanceId: body.componentInstanceId, kind: body.kind, occurredOn: body.occurredOn, notes: body.notes, recordedBy: user.id })
      .returning({ id: complications.id });
    return this.reply(row!.id);
  }

  /** The entry with its scope, if the user may see its patient; `supersededById` when already amended. */
  private async findVisible(db: Db, scope: Scope, id: string) {
    const [row] = await db
      .select({
        id: complications.id,
        practiceId: complications.practiceId,
        patientId: complications.patientId,
        siteId: complications.siteId,
        supersededById: supersededById(complications),
      })
      .from(complications)
      .innerJoin(patients, eq(patients.id, complications.patientId))
      .where(and(eq(complications.id, id), visiblePatients(scope)));
    return row ?? null;
  }

  /** A new version superseding the old entry; the old one stays, marked as amended. */
  async amend(ability: AppAbility, user: SessionUser, scope: Scope, id: string, body: z.output<typeof ComplicationAmendmentBody>): Promise<Complication> {
    const found = assertCan(ability, 'amend', 'Complication', await this.findVisible(this.db, scope, id), 'complication');
    assertCurrent(found);
    this.checkDate(body.occurredOn);
    await this.checkPart(found.siteId, body.componentInstanceId);
    const newId = await this.db.transaction(async (tx) => {
      // Lock the entry and re-read it: of two concurrent amendments of one entry only the first is saved.
      await tx.select({ id: complications.id }).from(complications).where(eq(complications.id, found.id)).for('update');
      assertCurrent((await this.findVisible(tx, scope, found.id))!);
      const [row] = await tx
        .insert(complications)
        .values({ practiceId: found.practiceId, patientId: found.patientId, siteId: found.siteId, componentInstanceId: body.componentInstanceId, kind: body.kind, occurredOn: body.occurredOn, notes: body.notes, supersedesId: found.id, amendmentReason: body.amendmentReason, recordedBy: user.id })
        .returning({ id: complications.id });
      return row!.id;
    });
    return this.reply(newId);
  }

  private async reply(id: string): Promise<Complication> {
    const [row] = await this.db
      .select({
        id: complications.id,
        siteId: complications.siteId,
        componentInstanceId: complications.componentInstanceId,
        kind: complications.kind,
        occurredOn: complications.occurredOn,
        notes: complications.notes,
        supersedesId: complications.supersedesId,
        amendmentReason: complications.amendmentReason,
        recordedByName: users.displayName,
      })
      .from(complications)
      .leftJoin(users, eq(users.id, complications.recordedBy))
      .where(eq(complications.id, id));
    return row!;
  }
}
