import {
  type AnyPgColumn,
  boolean,
  date,
  index,
  numeric,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { amendmentChain } from './amendment-chain.js';
import { componentKindEnum, connectionEnum, copingLevelEnum, trayEnum, wrenchTypeEnum } from './enums.js';
import { practices, users } from './practices.js';

const mm = (name: string) => numeric(name, { precision: 5, scale: 2, mode: 'number' });

/** Each practice keeps its own catalogue: values are what the practice entered. */
export const implantSystems = pgTable(
  'implant_systems',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    name: text('name').notNull(),
    manufacturer: text('manufacturer').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('implant_systems_practice_idx').on(t.practiceId)],
);

/**
 * Which implant system a GTIN (GS1 product number) belongs to, per practice: learned from the
 * first placement whose UDI carried it, or entered by the practice administrator (who may correct
 * a learned one). A placement whose UDI's GTIN belongs to another system is flagged.
 */
export const systemGtins = pgTable(
  'system_gtins',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    systemId: uuid('system_id')
      .notNull()
      .references(() => implantSystems.id),
    gtin: text('gtin').notNull(),
    /** Null when learned from a placement's UDI; the administrator who entered it otherwise. */
    enteredBy: uuid('entered_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('system_gtins_practice_gtin_unique').on(t.practiceId, t.gtin)],
);

export const platforms = pgTable(
  'platforms',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    systemId: uuid('system_id')
      .notNull()
      .references(() => implantSystems.id),
    name: text('name').notNull(),
    diameterMm: mm('diameter_mm').notNull(),
    connection: connectionEnum('connection').notNull(),
    platformShift: boolean('platform_shift').notNull(),
  },
  (t) => [index('platforms_system_idx').on(t.systemId)],
);

export const components = pgTable(
  'components',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    platformId: uuid('platform_id')
      .notNull()
      .references(() => platforms.id),
    kind: componentKindEnum('kind').notNull(),
    name: text('name').notNull(),
    referenceCode: text('reference_code').notNull(),
    /** Anti-rotational (indexed to the connection) or not; null where it does not apply (screws). */
    engaging: boolean('engaging'),
    angleDeg: numeric('angle_deg', { precision: 4, scale: 1, mode: 'number' }),
    collarHeightMm: mm('collar_height_mm'),
    /** Attachments: the largest divergence between two implants the manufacturer states it tolerates, degrees. */
    maxDivergenceDeg: numeric('max_divergence_deg', { precision: 4, scale: 1, mode: 'number' }),
    /**
     * Retentive inserts and clips: the strength as the manufacturer labels it (e.g. "light", "medium") and,
     * when the catalogue states one, the retention force in newtons. Manufacturers sell inserts by a named
     * (often colour-coded) strength and state forces in varying units or not at all: the label is what the
     * clinician picks from the box, the force (converted to N by whoever keeps the catalogue) compares systems.
     */
    retentionLabel: text('retention_label'),
    retentionN: numeric('retention_n', { precision: 5, scale: 1, mode: 'number' }),
    tray: trayEnum('tray'),
    /**
     * Impression copings and scan bodies: whether the part records the implant itself or a multi-unit
     * abutment on it, as the manufacturer states; null until the practice enters it (a Finding where
     * a rule reads it, never guessed from the name).
     */
    copingLevel: copingLevelEnum('coping_level'),
    /** Torque specification in N·cm; null means hand-tight. */
    torqueSpecNcm: numeric('torque_spec_ncm', { precision: 5, scale: 1, mode: 'number' }),
    tolerancePct: numeric('tolerance_pct', { precision: 4, scale: 1, mode: 'number' }).notNull().default(10),
    requiresLot: boolean('requires_lot').notNull().default(true),
    /**
     * Versions (ADR 0006): an edit is a new row superseding the current one; every version of a
     * part shares the first version's id as its lineage. Records point at the version they used.
     */
    lineageId: uuid('lineage_id')
      .notNull()
      .references((): AnyPgColumn => components.id),
    supersedesId: uuid('supersedes_id'),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('components_platform_idx').on(t.platformId),
    index('components_practice_idx').on(t.practiceId),
    index('components_lineage_idx').on(t.lineageId),
    index('components_practice_reference_idx').on(t.practiceId, t.referenceCode),
    ...amendmentChain('components', t),
  ],
);

/** A torque wrench, versioned like a part (ADR 0006): torque entries keep the version they used. */
export const torqueWrenches = pgTable(
  'torque_wrenches',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    label: text('label').notNull(),
    type: wrenchTypeEnum('type').notNull(),
    lineageId: uuid('lineage_id')
      .notNull()
      .references((): AnyPgColumn => torqueWrenches.id),
    supersedesId: uuid('supersedes_id'),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('torque_wrenches_lineage_idx').on(t.lineageId), ...amendmentChain('torque_wrenches', t)],
);

/** Each calibration of a wrench (its lineage: the physical instrument), kept as a history. */
export const wrenchCalibrations = pgTable(
  'wrench_calibrations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    wrenchLineageId: uuid('wrench_lineage_id')
      .notNull()
      .references(() => torqueWrenches.id),
    calibratedOn: date('calibrated_on', { mode: 'string' }).notNull(),
    note: text('note'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('wrench_calibrations_wrench_idx').on(t.wrenchLineageId, t.calibratedOn)],
);
