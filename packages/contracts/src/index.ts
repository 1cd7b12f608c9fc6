/**
 * The one contract between API and web: zod schemas for every request body and reply,
 * with their inferred TypeScript types under the same names.
 */
export * from './common.js';
export { ISO_DATE_MESSAGE, plainWordingProblems } from './plain-messages.js';
export { badInputs, fieldNames, requestSchemas } from './contract-walk.js';
export * from './enums.js';
export * from './dates.js';
export * from './auth.js';
export * from './health.js';
export * from './patients.js';
export * from './sites.js';
export * from './ledger.js';
export * from './recalls.js';
export * from './placements.js';
export * from './routes.js';
export * from './radiographs.js';
export * from './audit.js';
export * from './seating.js';
export * from './seat-restoration.js';
export * from './impressions.js';
export * from './password.js';
export * from './people.js';
export * from './outcomes.js';
export * from './shares.js';
export * from './records-out.js';
export * from './csv.js';
export * from './imports.js';
export * from './insert-changes.js';
