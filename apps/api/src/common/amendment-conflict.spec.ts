// The 409 mapping of a lost amendment race: only the supersedes_id unique indexes are mapped, also
// under drizzle's wrapper; every other error reaches the filter unchanged.
import { ConflictException } from '@nestjs/common';
import { DrizzleQueryError } from 'drizzle-orm/errors';
import { describe, expect, it } from 'vitest';
import { asAmendmentConflict } from './amendment-conflict.js';

const pgError = (code: string, constraint?: string) =>
  Object.assign(new Error('duplicate key value violates unique constraint'), { code, constraint });

describe('asAmendmentConflict', () => {
  it('maps a unique violation of a supersedes index, wrapped by drizzle, to the 409 of that table', () => {
    const mapped = asAmendmentConflict(
      new DrizzleQueryError('insert into "recall_exams" …', [], pgError('23505', 'recall_exams_supersedes_unique')),
    );
    expect(mapped).toBeInstanceOf(ConflictException);
    expect((mapped as ConflictException).message).toBe('This exam has already been amended; amend its latest version');
    expect((asAmendmentConflict(pgError('23505', 'placements_supersedes_unique')) as ConflictException).message).toBe(
      'This placement was already amended; amend the current version',
    );
  });

  it('leaves other unique violations and other errors as they are', () => {
    for (const error of [
      pgError('23505', 'implant_sites_patient_fdi_live_unique'),
      pgError('23503', 'placements_supersedes_fk'),
      new Error('boom'),
      'text',
    ]) {
      expect(asAmendmentConflict(error)).toBe(error);
    }
  });
});
