import { ForbiddenException, NotFoundException } from '@nestjs/common';
import { type Action, type AppAbility, type Subject, subject } from '@torquetrail/authz';
import type { SessionUser } from '../auth/session-user.js';
import { noteOpened } from '../common/audit-context.js';

/** What a repository needs to scope a query in SQL: the user's practice and their shares. */
export interface Scope {
  practiceId: string;
  sharedPatientIds: readonly string[];
  /**
   * Shared patients whose shares open chosen sites only, with those sites (several shares of one
   * patient add up; one share of every site lifts the limit). Patient-level lists keep, in SQL, only
   * the rows of these sites (`sharedSitesOf`).
   */
  siteLimits?: Readonly<Record<string, readonly string[]>>;
}

/**
 * The SQL mirror of `defineAbilityFor`, which opens shared patients to surgeons only: a share row
 * naming any other role must not put another practice's patient into a list (patients, Recall
 * desk, CSV) that the row-level checks would then refuse.
 */
export const scopeOf = (user: SessionUser): Scope => ({
  practiceId: user.practiceId,
  sharedPatientIds: user.role === 'surgeon' ? user.sharedPatientIds : [],
  siteLimits: user.role === 'surgeon' ? siteLimitsOf(user.shares) : {},
});

/** The chosen sites of each patient the given shares open (a share of every site lifts the limit). */
export function siteLimitsOf(shares: SessionUser['shares']): Record<string, readonly string[]> {
  const limits = new Map<string, Set<string> | null>();
  for (const share of shares) {
    const before = limits.get(share.patientId);
    if (before === null) continue;
    limits.set(share.patientId, share.siteIds ? new Set([...(before ?? []), ...share.siteIds]) : null);
  }
  return Object.fromEntries([...limits].flatMap(([patientId, sites]) => (sites ? [[patientId, [...sites]]] : [])));
}

/** The sites of a patient a list may show: null for all of them (own practice, or a share of every site). */
export const sharedSitesOf = (scope: Scope, patientId: string): readonly string[] | null =>
  scope.siteLimits?.[patientId] ?? null;

/**
 * A patient-level list of `type` rows (restorations, radiographs, exams …): the patient row must be
 * readable as `type` — or, under a share of chosen sites, as `type` on one of those sites, and the
 * list is then limited to them in SQL. Otherwise 404, like any row the user may not see.
 */
export function assertCanList<T extends { practiceId: string; id: string }>(
  ability: AppAbility,
  scope: Scope,
  type: Exclude<Subject, 'all'>,
  patient: T | null | undefined,
  what = 'patient',
): T {
  if (!patient) throw new NotFoundException(`No such ${what}`);
  // The audit row names the patient (a site's row names itself as the site: `asSiteRow`).
  const row = {
    practiceId: patient.practiceId,
    patientId: patient.id,
    id: type === 'ImplantSite' ? undefined : patient.id,
  };
  const onSite = (siteId: string) => ({ ...row, siteId, ...(type === 'ImplantSite' ? { id: siteId } : {}) });
  const site = sharedSitesOf(scope, patient.id)?.find((id) => ability.can('read', subject(type, onSite(id))));
  assertCan(ability, 'read', type, site ? onSite(site) : row, what);
  return patient;
}

/**
 * An implant site's row checked as another subject (its placement, exams, bone levels): it names
 * itself as the site, so a share limited to chosen sites decides on it.
 */
export const asSiteRow = <T extends { id: string }>(site: T | null | undefined) =>
  site ? { ...site, siteId: site.id } : null;

function asJudged<T extends { siteId?: string | null; siteIds?: readonly string[] | null }>(
  ability: AppAbility,
  type: Exclude<Subject, 'all'>,
  row: T,
) {
  const { siteIds, ...rest } = row;
  const candidates =
    rest.siteId === undefined && siteIds ? [rest, ...siteIds.map((siteId) => ({ ...rest, siteId }))] : [rest];
  return candidates.find((candidate) => ability.can('read', subject(type, { ...candidate })));
}

/**
 * Row-level check of a loaded row. A row the user may not see answers 404, exactly like a row
 * that does not exist, so existence does not leak across practices; a row they may see but not
 * change answers 403.
 */
export function assertCan<
  T extends {
    practiceId: string;
    patientId?: string;
    id?: string;
    siteId?: string | null;
    siteIds?: readonly string[] | null;
  },
>(ability: AppAbility, action: Action, type: Exclude<Subject, 'all'>, row: T | null | undefined, what = 'record'): T {
  // A row spanning several sites (a bridge, a radiograph of two implants) is judged on each of them:
  // a share of one of its sites opens it.
  const judged = row ? asJudged(ability, type, row) : null;
  if (!row || !judged) {
    throw new NotFoundException(`No such ${what}`);
  }
  if (action !== 'read' && !ability.can(action, subject(type, { ...judged }))) {
    throw new ForbiddenException(`Your role may not ${action} this ${what}`);
  }
  // Every row a request may open passes here: its audit row names the record and the patient.
  noteOpened(type, row);
  return row;
}
