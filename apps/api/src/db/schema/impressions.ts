import { sql } from 'drizzle-orm';
import {
  bigint,
  check,
  date,
  doublePrecision,
  index,
  pgTable,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { amendmentChain } from './amendment-chain.js';
import { components } from './catalogue.js';
import { impressionMethodEnum, scanFileTypeEnum } from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';
import { restorations } from './restorations.js';
import { implantSites } from './sites.js';

/**
 * The impression of a restoration: analog (copings, as planned per site) or digital (an intraoral
 * scan). Amended, never edited: a correction is a new row superseding the old one, with its reason,
 * and carries its own scan bodies.
 */
export const impressions = pgTable(
  'impressions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    restorationId: uuid('restoration_id')
      .notNull()
      .references(() => restorations.id),
    method: impressionMethodEnum('method').notNull(),
    takenOn: date('taken_on', { mode: 'string' }).notNull(),
    note: text('note'),
    recordedBy: uuid('recorded_by')
      .notNull()
      .references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
  },
  (t) => [
    index('impressions_patient_idx').on(t.patientId),
    index('impressions_restoration_idx').on(t.restorationId),
    // One first version per restoration; later ones are amendments of it. Two first impressions
    // racing are decided here.
    uniqueIndex('impressions_first_unique')
      .on(t.restorationId)
      .where(sql`${t.supersedesId} is null`),
    ...amendmentChain('impressions', t),
  ],
);

/** The scan body used at one site of a digital impression (one version), with its lot. */
export const impressionScanBodies = pgTable(
  'impression_scan_bodies',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    impressionId: uuid('impression_id')
      .notNull()
      .references(() => impressions.id),
    siteId: uuid('site_id')
      .notNull()
      .references(() => implantSites.id),
    componentId: uuid('component_id')
      .notNull()
      .references(() => components.id),
    lot: text('lot'),
  },
  (t) => [
    index('impression_scan_bodies_site_idx').on(t.siteId),
    unique('impression_scan_bodies_site_unique').on(t.impressionId, t.siteId),
    index('impression_scan_bodies_component_idx').on(t.componentId),
    index('impression_scan_bodies_practice_lot_idx')
      .on(t.practiceId, t.lot)
      .where(sql`${t.lot} is not null`),
  ],
);

/**
 * A scanner's mesh file of a digital impression, kept in object storage under a key the server
 * chooses; the client's name is data only. Never deleted.
 */
export const scanFiles = pgTable(
  'scan_files',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    restorationId: uuid('restoration_id')
      .notNull()
      .references(() => restorations.id),
    impressionId: uuid('impression_id')
      .notNull()
      .references(() => impressions.id),
    objectKey: text('object_key').notNull(),
    sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull(),
    sha256: text('sha256').notNull(),
    fileType: scanFileTypeEnum('file_type').notNull(),
    originalName: text('original_name'),
    uploadedBy: uuid('uploaded_by')
      .notNull()
      .references(() => users.id),
    uploadedAt: timestamp('uploaded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('scan_files_patient_idx').on(t.patientId),
    index('scan_files_impression_idx').on(t.impressionId),
    index('scan_files_restoration_idx').on(t.restorationId),
    unique('scan_files_object_key_unique').on(t.objectKey),
    unique('scan_files_restoration_sha256_unique').on(t.restorationId, t.sha256),
  ],
);

/**
 * Where a recorded scan body stands in a scan file: the point a clinician picked on the mesh, in
 * the file's own coordinates (the scanner's units). One chain per file and site. Amended, never
 * overwritten: moving a marker is a new row superseding the old one, clearing it a new row with no
 * point (x, y and z all null).
 */
export const scanBodyMarkers = pgTable(
  'scan_body_markers',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    scanFileId: uuid('scan_file_id')
      .notNull()
      .references(() => scanFiles.id),
    siteId: uuid('site_id')
      .notNull()
      .references(() => implantSites.id),
    x: doublePrecision('x'),
    y: doublePrecision('y'),
    z: doublePrecision('z'),
    placedBy: uuid('placed_by')
      .notNull()
      .references(() => users.id),
    placedAt: timestamp('placed_at', { withTimezone: true }).notNull().defaultNow(),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
  },
  (t) => [
    index('scan_body_markers_patient_idx').on(t.patientId),
    index('scan_body_markers_site_idx').on(t.siteId),
    index('scan_body_markers_scan_file_idx').on(t.scanFileId),
    // One first marker per file and site; later ones amend it. Two first markers racing are decided here.
    uniqueIndex('scan_body_markers_first_unique')
      .on(t.scanFileId, t.siteId)
      .where(sql`${t.supersedesId} is null`),
    // A point is whole or absent (cleared), never partly given.
    check(
      'scan_body_markers_point_whole',
      sql`(${t.x} is null) = (${t.y} is null) and (${t.y} is null) = (${t.z} is null)`,
    ),
    ...amendmentChain('scan_body_markers', t),
  ],
);
