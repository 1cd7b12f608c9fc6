import { ForbiddenException, NotFoundException } from '@nestjs/common';
import { type Action, type AppAbility, type Subject, subject } from '@torquetrail/authz';
import type { SessionUser } from '../auth/session-user.js';
import { noteOpened } from '../common/audit-context.js';

/** What a repository needs to scope a query in SQL: the user's practice and their shares. */
export interface Scope {
  practiceId: string;
  sharedPatientIds: readonly string[];
}

/**
 * The SQL mirror of `defineAbilityFor`, which opens shared patients to surgeons only: a share row
 * naming any other role must not put another practice's patient into a list (patients, Recall
 * desk, CSV) that the row-level checks would then refuse.
 */
export const scopeOf = (user: SessionUser): Scope => ({
  practiceId: user.practiceId,
  sharedPatientIds: user.role === 'surgeon' ? user.sharedPatientIds : [],
});

/**
 * An implant site's row checked as another subject (its placement, exams, bone levels): it names
 * itself as the site, so a share limited to chosen sites decides on it.
 */
export const asSiteRow = <T extends { id: string }>(site: T | null | undefined) =>
  site ? { ...site, siteId: site.id } : null;

/**
 * Row-level check of a loaded row. A row the user may not see answers 404, exactly like a row
 * that does not exist, so existence does not leak across practices; a row they may see but not
 * change answers 403.
 */
export function assertCan<T extends { practiceId: string; patientId?: string; id?: string; siteId?: string | null }>(
  ability: AppAbility,
  action: Action,
  type: Exclude<Subject, 'all'>,
  row: T | null | undefined,
  what = 'record',
): T {
  if (!row || !ability.can('read', subject(type, { ...row }))) {
    throw new NotFoundException(`No such ${what}`);
  }
  if (action !== 'read' && !ability.can(action, subject(type, { ...row }))) {
    throw new ForbiddenException(`Your role may not ${action} this ${what}`);
  }
  // Every row a request may open passes here: its audit row names the record and the patient.
  noteOpened(type, row);
  return row;
}
