// The whole schema, one file per area. drizzle-kit reads this file (drizzle.config.ts).
export * from './enums.js';
export * from './practices.js';
export * from './patients.js';
export * from './catalogue.js';
export * from './sites.js';
export * from './restorations.js';
export * from './recalls.js';
export * from './radiographs.js';
export * from './audit.js';
export * from './seating.js';
export * from './impressions.js';
export * from './people.js';
export * from './referrals.js';
export * from './records-out.js';
export * from './imports.js';
// insert_changes lives in restorations.js: component_instances (the fitted inserts) references it.
