import { subject as asSubject } from '@casl/ability';
import { permittedFieldsOf } from '@casl/ability/extra';
import type { AppAbility, Subject } from './ability.js';

const EVERY_FIELD = '*every field*';

/**
 * The fields of `row` (a `type`) the ability lets the user read, by CASL field rules; null when a
 * rule without fields allows the whole row (one's own practice), so nothing is to be left out.
 */
export function readableFields(
  ability: AppAbility,
  type: Exclude<Subject, 'all'>,
  row: Record<string, unknown>,
): string[] | null {
  const fields = permittedFieldsOf(ability, 'read', asSubject(type, { ...row }), {
    fieldsFrom: (rule) => rule.fields ?? [EVERY_FIELD],
  });
  return fields.includes(EVERY_FIELD) ? null : fields;
}
