import {
  bigint,
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  unique,
  uuid,
} from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { amendmentChain } from './amendment-chain.js';
import { radiographFileTypeEnum, radiographKindEnum, radiographPreviewStatusEnum } from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';
import { implantSites } from './sites.js';

/**
 * One uploaded radiograph. The object key is chosen by the server (practice/patient/uuid); the
 * client's file name is kept as data only. DICOM attributes that measurement needs are copied out
 * of the file at upload. A radiograph is never deleted: a wrong one is marked entered-in-error.
 */
export const radiographs = pgTable(
  'radiographs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    objectKey: text('object_key').notNull(),
    sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull(),
    sha256: text('sha256').notNull(),
    fileType: radiographFileTypeEnum('file_type').notNull(),
    originalName: text('original_name'),
    kind: radiographKindEnum('kind').notNull(),
    takenOn: date('taken_on', { mode: 'string' }),
    note: text('note'),
    /** Image size in pixels (from DICOM Rows/Columns or the image header). */
    rows: integer('rows'),
    columns: integer('columns'),
    /** DICOM (0028,0030) and (0018,1164): [row mm, column mm]. */
    pixelSpacing: jsonb('pixel_spacing').$type<[number, number]>(),
    imagerPixelSpacing: jsonb('imager_pixel_spacing').$type<[number, number]>(),
    /** DICOM (0018,1114). */
    magnificationFactor: doublePrecision('magnification_factor'),
    studyDate: date('study_date', { mode: 'string' }),
    modality: text('modality'),
    bitsStored: integer('bits_stored'),
    photometricInterpretation: text('photometric_interpretation'),
    transferSyntaxUid: text('transfer_syntax_uid'),
    /**
     * The preview and thumbnail are made by a job after the row commits (pending), then ready, or
     * unavailable with the reason in preview_problem (e.g. a compressed transfer syntax, an image
     * over the pixel limit, or storage failing through every retry).
     */
    previewStatus: radiographPreviewStatusEnum('preview_status').notNull().default('pending'),
    previewProblem: text('preview_problem'),
    /** Failed attempts of the preview job so far (retries are visible while pending). */
    previewAttempts: integer('preview_attempts').notNull().default(0),
    uploadedBy: uuid('uploaded_by')
      .notNull()
      .references(() => users.id),
    uploadedAt: timestamp('uploaded_at', { withTimezone: true }).notNull().defaultNow(),
    enteredInErrorAt: timestamp('entered_in_error_at', { withTimezone: true }),
    enteredInErrorBy: uuid('entered_in_error_by').references(() => users.id),
    enteredInErrorReason: text('entered_in_error_reason'),
  },
  (t) => [
    unique('radiographs_object_key_unique').on(t.objectKey),
    // The same file twice for one patient is refused (409); the index decides a race too.
    unique('radiographs_patient_sha256_unique').on(t.patientId, t.sha256),
    index('radiographs_patient_idx').on(t.patientId, t.takenOn),
    index('radiographs_uploader_day_idx').on(t.uploadedBy, t.uploadedAt),
    // The sweep finds rows still waiting for their preview.
    index('radiographs_preview_pending_idx')
      .on(t.uploadedAt)
      .where(sql`${t.previewStatus} = 'pending'`),
  ],
);

/** The implant sites a radiograph shows (several on a panoramic). */
export const radiographSites = pgTable(
  'radiograph_sites',
  {
    radiographId: uuid('radiograph_id')
      .notNull()
      .references(() => radiographs.id),
    siteId: uuid('site_id')
      .notNull()
      .references(() => implantSites.id),
  },
  (t) => [primaryKey({ columns: [t.radiographId, t.siteId] }), index('radiograph_sites_site_idx').on(t.siteId)],
);

/**
 * A bone-level measurement of one site on one radiograph: every image point, the calibration used
 * and both results. Amended, never edited.
 */
export const radiographMeasurements = pgTable(
  'radiograph_measurements',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    radiographId: uuid('radiograph_id')
      .notNull()
      .references(() => radiographs.id),
    siteId: uuid('site_id')
      .notNull()
      .references(() => implantSites.id),
    /** The ImplantMarks of the domain: platform pair, apex, mesial, distal (image pixels). */
    points: jsonb('points').$type<Record<string, unknown>>().notNull(),
    implantTrueMm: doublePrecision('implant_true_mm').notNull(),
    mmPerUnit: doublePrecision('mm_per_unit').notNull(),
    mesialMm: doublePrecision('mesial_mm').notNull(),
    distalMm: doublePrecision('distal_mm').notNull(),
    /** The Pixel Spacing estimate beside the calibrated one, when the image has spacing. */
    spacingEstimate: jsonb('spacing_estimate').$type<Record<string, unknown>>(),
    rulesVersion: text('rules_version').notNull(),
    measuredBy: uuid('measured_by')
      .notNull()
      .references(() => users.id),
    measuredAt: timestamp('measured_at', { withTimezone: true }).notNull().defaultNow(),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
  },
  (t) => [
    index('radiograph_measurements_patient_idx').on(t.patientId),
    index('radiograph_measurements_site_idx').on(t.siteId, t.measuredAt),
    // A radiograph's measurements (its detail, the bone levels offered to an exam).
    index('radiograph_measurements_radiograph_idx').on(t.radiographId),
    ...amendmentChain('radiograph_measurements', t),
  ],
);
