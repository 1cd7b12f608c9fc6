/**
 * Roles, actions and subjects of Torquetrail and the CASL ability per role.
 * The API's guard and services and the web's <Can> use this one definition.
 */
export { subject } from '@casl/ability';
export { defineAbilityFor, PATIENT_CONTACT_FIELDS, ROLES, SHARE_SCOPES } from './ability.js';
export { SHARED_PATIENT_FIELDS } from './shared-fields.js';
export { readableFields } from './fields.js';
export type {
  AbilityUser,
  ActiveShare,
  ShareScope,
  Action,
  AppAbility,
  PatientContactField,
  Role,
  ScopedRow,
  Subject,
} from './ability.js';
