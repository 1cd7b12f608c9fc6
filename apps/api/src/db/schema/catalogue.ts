import { boolean, date, index, numeric, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { componentKindEnum, connectionEnum, trayEnum, wrenchTypeEnum } from './enums.js';
import { practices } from './practices.js';

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
    tray: trayEnum('tray'),
    /** Torque specification in N·cm; null means hand-tight. */
    torqueSpecNcm: numeric('torque_spec_ncm', { precision: 5, scale: 1, mode: 'number' }),
    tolerancePct: numeric('tolerance_pct', { precision: 4, scale: 1, mode: 'number' }).notNull().default(10),
    requiresLot: boolean('requires_lot').notNull().default(true),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('components_platform_idx').on(t.platformId), index('components_practice_idx').on(t.practiceId)],
);

export const torqueWrenches = pgTable('torque_wrenches', {
  id: uuid('id').primaryKey().defaultRandom(),
  practiceId: uuid('practice_id')
    .notNull()
    .references(() => practices.id),
  label: text('label').notNull(),
  type: wrenchTypeEnum('type').notNull(),
  lastCalibratedOn: date('last_calibrated_on', { mode: 'string' }),
});
