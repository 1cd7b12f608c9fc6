import { sql } from 'drizzle-orm';
import { date, index, numeric, pgTable, smallint, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { amendmentChain } from './amendment-chain.js';
import { platforms } from './catalogue.js';
import { loadingProtocolEnum, siteStatusEnum } from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';

export const implantSites = pgTable(
  'implant_sites',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    /** FDI (ISO 3950) two-digit position. */
    fdi: smallint('fdi').notNull(),
    status: siteStatusEnum('status').notNull(),
    /** When a failed or removed implant left the mouth: the end of its survival (outcomes view). */
    endedOn: date('ended_on', { mode: 'string' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('implant_sites_patient_idx').on(t.patientId),
    // One live site per position; a failed or removed site stays in the record and a new one may be planned there.
    uniqueIndex('implant_sites_patient_fdi_live_unique')
      .on(t.patientId, t.fdi)
      .where(sql`${t.status} not in ('failed', 'removed')`),
    index('implant_sites_practice_idx').on(t.practiceId),
  ],
);

/**
 * What the surgeon placed. Never overwritten: an amendment is a new row that supersedes the
 * old one, with its reason; the current placement is the one no other row supersedes.
 */
export const placements = pgTable(
  'placements',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    siteId: uuid('site_id')
      .notNull()
      .references(() => implantSites.id),
    platformId: uuid('platform_id')
      .notNull()
      .references(() => platforms.id),
    placedOn: date('placed_on', { mode: 'string' }).notNull(),
    surgeonUserId: uuid('surgeon_user_id').references(() => users.id),
    surgeonName: text('surgeon_name').notNull(),
    lengthMm: numeric('length_mm', { precision: 5, scale: 2, mode: 'number' }).notNull(),
    lot: text('lot'),
    udi: text('udi'),
    /** The GTIN read from `udi` by parseUdi when recorded, kept so the lot look-up can use an index. */
    gtin: text('gtin'),
    insertionTorqueNcm: numeric('insertion_torque_ncm', { precision: 5, scale: 1, mode: 'number' }),
    stabilityIsq: smallint('stability_isq'),
    grafting: text('grafting'),
    loadingProtocol: loadingProtocolEnum('loading_protocol'),
    /** Implant axis as a direction vector in the patient's frame, when known. */
    axisX: numeric('axis_x', { mode: 'number' }),
    axisY: numeric('axis_y', { mode: 'number' }),
    axisZ: numeric('axis_z', { mode: 'number' }),
    notes: text('notes'),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('placements_patient_idx').on(t.patientId),
    index('placements_site_idx').on(t.siteId),
    // The lot look-up (a field safety notice names a lot or a GTIN).
    index('placements_practice_lot_idx')
      .on(t.practiceId, t.lot)
      .where(sql`${t.lot} is not null`),
    index('placements_practice_gtin_idx')
      .on(t.practiceId, t.gtin)
      .where(sql`${t.gtin} is not null`),
    ...amendmentChain('placements', t),
  ],
);
