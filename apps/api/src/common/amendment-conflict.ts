import { ConflictException } from '@nestjs/common';
import type { AppAbility, Subject } from '@torquetrail/authz';
import { assertCan } from '../authz/scope.js';
import { AMENDABLE_TABLES, type AmendableTableName, supersedesUniqueName } from '../db/schema/amendment-chain.js';
import { postgresError } from './postgres-error.js';

/** What a second amendment of one version is told, per table: the same words before and during a race. */
const ALREADY_AMENDED: Record<AmendableTableName, string> = {
  placements: 'This placement was already amended; amend the current version',
  restorations: 'This version was already amended; amend the current version',
  torque_events: 'This entry was already amended; amend the current version',
  complications: 'This entry was already amended; amend the current version',
  recall_exams: 'This exam has already been amended; amend its latest version',
  components: 'This part has a newer version in the catalogue; edit its current version',
  torque_wrenches: 'This wrench has a newer version; edit its current version',
  radiograph_measurements: 'This measurement was already amended; amend its latest version',
  seating_checks: 'This seating check was already amended; amend its latest version',
  impressions: 'This impression was already amended; amend its latest version',
  insert_changes: 'This insert change was already amended; amend its latest version',
  scan_body_markers: 'This marker was already moved or cleared; reload the markers and place it again',
};

/** 409 for an amendment of a version that a newer row already supersedes. */
export const alreadyAmended = (table: AmendableTableName) => new ConflictException(ALREADY_AMENDED[table]);

/**
 * The first step of every amendment: the user may amend this row (404/403 as `assertCan`), and
 * it is still the current version (409 otherwise, before any other work is done).
 */
export function assertAmendable<T extends { practiceId: string; supersededById: string | null }>(
  ability: AppAbility,
  type: Exclude<Subject, 'all'>,
  row: T | null | undefined,
  what: string,
  table: AmendableTableName,
): T {
  const found = assertCan(ability, 'amend', type, row, what);
  if (found.supersededById) throw alreadyAmended(table);
  return found;
}

const TABLE_OF_INDEX = new Map<string, AmendableTableName>(AMENDABLE_TABLES.map((t) => [supersedesUniqueName(t), t]));

/**
 * The one place where the database's answer to a second amendment becomes HTTP: a unique
 * violation of a `<table>_supersedes_unique` index (two amendments of one version raced, and the
 * other committed first) is the same 409 the services give when they see the amendment up front.
 * Any other error is returned unchanged.
 */
export function asAmendmentConflict(error: unknown): unknown {
  const pg = postgresError(error);
  const table = pg?.code === '23505' && pg.constraint ? TABLE_OF_INDEX.get(pg.constraint) : undefined;
  return table ? alreadyAmended(table) : error;
}
