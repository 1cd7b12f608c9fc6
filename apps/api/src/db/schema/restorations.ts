import { boolean, date, index, numeric, pgTable, smallint, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { components, torqueWrenches } from './catalogue.js';
import {
  impressionCopingEnum,
  interfaceEnum,
  materialEnum,
  restorationKindEnum,
  restorationStatusEnum,
  retentionEnum,
  torqueReasonEnum,
  torqueVerdictEnum,
} from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';
import { implantSites } from './sites.js';

export const restorations = pgTable(
  'restorations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id').notNull().references(() => practices.id),
    patientId: uuid('patient_id').notNull().references(() => patients.id),
    kind: restorationKindEnum('kind').notNull(),
    retention: retentionEnum('retention').notNull(),
    material: materialEnum('material').notNull(),
    shade: text('shade'),
    status: restorationStatusEnum('status').notNull(),
    copingsSplinted: boolean('copings_splinted').notNull().default(false),
    impressionTakenOn: date('impression_taken_on', { mode: 'string' }),
    deliveredOn: date('delivered_on', { mode: 'string' }),
    plannedBy: uuid('planned_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('restorations_patient_idx').on(t.patientId)],
);

/** One implant site of a restoration, with the interface and impression technique used there. */
export const restorationSites = pgTable(
  'restoration_sites',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id').notNull().references(() => practices.id),
    restorationId: uuid('restoration_id').notNull().references(() => restorations.id),
    siteId: uuid('site_id').notNull().references(() => implantSites.id),
    interface: interfaceEnum('interface').notNull(),
    impressionCoping: impressionCopingEnum('impression_coping').notNull(),
    multiUnitAngleDeg: smallint('multi_unit_angle_deg'),
    restorativeSpaceMm: numeric('restorative_space_mm', { precision: 4, scale: 1, mode: 'number' }),
  },
  (t) => [index('restoration_sites_site_idx').on(t.siteId), index('restoration_sites_restoration_idx').on(t.restorationId)],
);

/**
 * A physical part in the mouth (abutment, multi-unit, screw …) at one site. A replaced part is
 * never deleted: it gets `removedOn` and a new instance takes its place, so history is kept.
 */
export const componentInstances = pgTable(
  'component_instances',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id').notNull().references(() => practices.id),
    patientId: uuid('patient_id').notNull().references(() => patients.id),
    siteId: uuid('site_id').notNull().references(() => implantSites.id),
    restorationId: uuid('restoration_id').references(() => restorations.id),
    componentId: uuid('component_id').notNull().references(() => components.id),
    lot: text('lot'),
    installedOn: date('installed_on', { mode: 'string' }).notNull(),
    removedOn: date('removed_on', { mode: 'string' }),
    replacesId: uuid('replaces_id'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('component_instances_site_idx').on(t.siteId)],
);

/** Every torque ever applied to a part, with the verdict computed when it was recorded. */
export const torqueEvents = pgTable(
  'torque_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id').notNull().references(() => practices.id),
    patientId: uuid('patient_id').notNull().references(() => patients.id),
    componentInstanceId: uuid('component_instance_id').notNull().references(() => componentInstances.id),
    appliedNcm: numeric('applied_ncm', { precision: 5, scale: 1, mode: 'number' }).notNull(),
    specNcm: numeric('spec_ncm', { precision: 5, scale: 1, mode: 'number' }).notNull(),
    tolerancePct: numeric('tolerance_pct', { precision: 4, scale: 1, mode: 'number' }).notNull(),
    verdict: torqueVerdictEnum('verdict').notNull(),
    rulesVersion: text('rules_version').notNull(),
    reason: torqueReasonEnum('reason').notNull(),
    wrenchId: uuid('wrench_id').references(() => torqueWrenches.id),
    performedAt: timestamp('performed_at', { withTimezone: true }).notNull(),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('torque_events_instance_idx').on(t.componentInstanceId, t.performedAt)],
);
