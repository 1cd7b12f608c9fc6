import {
  type AnyPgColumn,
  boolean,
  date,
  index,
  integer,
  jsonb,
  numeric,
  pgTable,
  smallint,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { amendmentChain } from './amendment-chain.js';
import { components, torqueWrenches } from './catalogue.js';
import {
  complicationKindEnum,
  insertChangeReasonEnum,
  impressionCopingEnum,
  interfaceEnum,
  materialEnum,
  restorationKindEnum,
  restorationStatusEnum,
  retentionEnum,
  torqueReasonEnum,
  reminderStatusEnum,
  torqueVerdictEnum,
} from './enums.js';
import { patients } from './patients.js';
import { practices, users } from './practices.js';
import { implantSites } from './sites.js';

export const restorations = pgTable(
  'restorations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    kind: restorationKindEnum('kind').notNull(),
    retention: retentionEnum('retention').notNull(),
    material: materialEnum('material').notNull(),
    shade: text('shade'),
    status: restorationStatusEnum('status').notNull(),
    copingsSplinted: boolean('copings_splinted').notNull().default(false),
    impressionTakenOn: date('impression_taken_on', { mode: 'string' }),
    deliveredOn: date('delivered_on', { mode: 'string' }),
    plannedBy: uuid('planned_by').references(() => users.id),
    /** Plan Findings as computed when saved (validateRestorationPlan), with the rules version. */
    findings: jsonb('findings').$type<unknown[]>().notNull().default([]),
    rulesVersion: text('rules_version'),
    labName: text('lab_name'),
    labEmail: text('lab_email'),
    dueOn: date('due_on', { mode: 'string' }),
    notes: text('notes'),
    /** A provisional (e.g. at immediate loading) awaiting its definitive restoration on the planned day. */
    provisional: boolean('provisional').notNull().default(false),
    plannedReplacementOn: date('planned_replacement_on', { mode: 'string' }),
    /**
     * Distal cantilevers (patient's left and right) and the entered A-P spread of the implants, mm:
     * recorded for the kinds in CANTILEVER_KINDS (@torquetrail/domain).
     */
    cantileverLeftMm: numeric('cantilever_left_mm', { precision: 4, scale: 1, mode: 'number' }),
    cantileverRightMm: numeric('cantilever_right_mm', { precision: 4, scale: 1, mode: 'number' }),
    apSpreadMm: numeric('ap_spread_mm', { precision: 4, scale: 1, mode: 'number' }),
    /**
     * The restoration delivered on its sites that took this one out (set with status 'removed'):
     * a provisional stays in the record, marked replaced by its definitive restoration.
     */
    replacedById: uuid('replaced_by_id').references((): AnyPgColumn => restorations.id),
    /** An amendment is a new row superseding the old one, with its reason. */
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('restorations_replaced_by_idx')
      .on(t.replacedById)
      .where(sql`${t.replacedById} is not null`),
    index('restorations_patient_idx').on(t.patientId),
    // The Recall desk's provisionals: delivered, still in place, by planned replacement day.
    index('restorations_provisional_due_idx')
      .on(t.practiceId, t.plannedReplacementOn)
      .where(sql`${t.provisional} and ${t.status} = 'delivered'`),
    ...amendmentChain('restorations', t),
  ],
);

/** One implant site of a restoration, with the interface and impression technique used there. */
export const restorationSites = pgTable(
  'restoration_sites',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    restorationId: uuid('restoration_id')
      .notNull()
      .references(() => restorations.id),
    siteId: uuid('site_id')
      .notNull()
      .references(() => implantSites.id),
    interface: interfaceEnum('interface').notNull(),
    impressionCoping: impressionCopingEnum('impression_coping').notNull(),
    /** As the catalogue states the multi-unit's angle (one decimal, like components.angle_deg). */
    multiUnitAngleDeg: numeric('multi_unit_angle_deg', { precision: 4, scale: 1, mode: 'number' }),
    restorativeSpaceMm: numeric('restorative_space_mm', { precision: 4, scale: 1, mode: 'number' }),
    /** Implant axis entered in the planner (direction vector), when not taken from the placement. */
    axisX: numeric('axis_x', { mode: 'number' }),
    axisY: numeric('axis_y', { mode: 'number' }),
    axisZ: numeric('axis_z', { mode: 'number' }),
  },
  (t) => [
    index('restoration_sites_site_idx').on(t.siteId),
    index('restoration_sites_restoration_idx').on(t.restorationId),
  ],
);

/**
 * A physical part in the mouth (abutment, multi-unit, screw …) at one site. A replaced part is
 * never deleted: it gets `removedOn` and a new instance takes its place, so history is kept. A
 * part "in place" is neither removed nor entered in error (`partInPlace` in db/parts-in-place.ts).
 */
export const componentInstances = pgTable(
  'component_instances',
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
    restorationId: uuid('restoration_id').references(() => restorations.id),
    componentId: uuid('component_id')
      .notNull()
      .references(() => components.id),
    lot: text('lot'),
    installedOn: date('installed_on', { mode: 'string' }).notNull(),
    removedOn: date('removed_on', { mode: 'string' }),
    replacesId: uuid('replaces_id'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
    /** The insert change (the version) that fitted this insert or clip; null for every other part. */
    insertChangeId: uuid('insert_change_id').references((): AnyPgColumn => insertChanges.id),
    /**
     * Set when an amendment of its insert change says this part was never fitted (another part, or
     * another day): the row stays for the record, and the Stack and Site file leave it out.
     */
    enteredInErrorAt: timestamp('entered_in_error_at', { withTimezone: true }),
    enteredInErrorReason: text('entered_in_error_reason'),
  },
  (t) => [
    index('component_instances_patient_idx').on(t.patientId),
    index('component_instances_restoration_idx')
      .on(t.restorationId)
      .where(sql`${t.restorationId} is not null`),
    index('component_instances_site_idx').on(t.siteId),
    index('component_instances_insert_change_idx')
      .on(t.insertChangeId)
      .where(sql`${t.insertChangeId} is not null`),
    // The lot look-up: by lot, or by the catalogue part (all versions of a reference code).
    index('component_instances_practice_lot_idx')
      .on(t.practiceId, t.lot)
      .where(sql`${t.lot} is not null`),
    index('component_instances_component_idx').on(t.componentId),
  ],
);

/** Every torque ever applied to a part, with the verdict computed when it was recorded. */
export const torqueEvents = pgTable(
  'torque_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    componentInstanceId: uuid('component_instance_id')
      .notNull()
      .references(() => componentInstances.id),
    appliedNcm: numeric('applied_ncm', { precision: 5, scale: 1, mode: 'number' }).notNull(),
    specNcm: numeric('spec_ncm', { precision: 5, scale: 1, mode: 'number' }).notNull(),
    tolerancePct: numeric('tolerance_pct', { precision: 4, scale: 1, mode: 'number' }).notNull(),
    verdict: torqueVerdictEnum('verdict').notNull(),
    rulesVersion: text('rules_version').notNull(),
    reason: torqueReasonEnum('reason').notNull(),
    wrenchId: uuid('wrench_id').references(() => torqueWrenches.id),
    /** The wrench's calibration was overdue when the torque was recorded: the verdict carries the flag. */
    wrenchCalibrationOverdue: boolean('wrench_calibration_overdue').notNull().default(false),
    /** A settling re-torque logged earlier than the settling time, which the clinician confirmed. */
    earlySettlingConfirmed: boolean('early_settling_confirmed').notNull().default(false),
    performedAt: timestamp('performed_at', { withTimezone: true }).notNull(),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('torque_events_patient_idx').on(t.patientId),
    index('torque_events_instance_idx').on(t.componentInstanceId, t.performedAt),
    ...amendmentChain('torque_events', t),
  ],
);

/** The catalogue parts chosen in the plan for one site (abutment, multi-unit, screws, coping). */
export const restorationSiteComponents = pgTable(
  'restoration_site_components',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    restorationSiteId: uuid('restoration_site_id')
      .notNull()
      .references(() => restorationSites.id),
    componentId: uuid('component_id')
      .notNull()
      .references(() => components.id),
  },
  (t) => [index('restoration_site_components_site_idx').on(t.restorationSiteId)],
);

/** A warning Finding acknowledged by a clinician before saving the plan. */
export const findingAcknowledgements = pgTable(
  'finding_acknowledgements',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    restorationId: uuid('restoration_id')
      .notNull()
      .references(() => restorations.id),
    code: text('code').notNull(),
    fdi: smallint('fdi'),
    acknowledgedBy: uuid('acknowledged_by')
      .notNull()
      .references(() => users.id),
    acknowledgedAt: timestamp('acknowledged_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('finding_acknowledgements_restoration_idx').on(t.restorationId)],
);

/** A generated lab prescription PDF, kept in object storage. */
export const labPrescriptions = pgTable(
  'lab_prescriptions',
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
    /**
     * The prescription number printed on the sheet and quoted by the lab: the practice's own
     * running number (practices.lab_prescription_counter), drawn before the PDF is rendered so the
     * PDF carries it; unique within the practice, never reused. Per practice, so one practice's
     * numbers say nothing about how many prescriptions another writes.
     */
    number: integer('number').notNull(),
    objectKey: text('object_key').notNull(),
    sizeBytes: integer('size_bytes').notNull(),
    emailedTo: text('emailed_to'),
    emailedAt: timestamp('emailed_at', { withTimezone: true }),
    createdBy: uuid('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('lab_prescriptions_patient_idx').on(t.patientId),
    index('lab_prescriptions_restoration_idx').on(t.restorationId),
    unique('lab_prescriptions_object_key_unique').on(t.objectKey),
    unique('lab_prescriptions_practice_number_unique').on(t.practiceId, t.number),
  ],
);

/**
 * One request to e-mail a stored lab prescription to the lab, sent by the job queue: pending
 * until SMTP accepts it (then sent, once), failed after the last retry. The same delivery states
 * as reminders. At most one pending request per prescription, so pressing again while one waits
 * queues nothing more.
 */
export const labPrescriptionMails = pgTable(
  'lab_prescription_mails',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    labPrescriptionId: uuid('lab_prescription_id')
      .notNull()
      .references(() => labPrescriptions.id),
    sentTo: text('sent_to').notNull(),
    status: reminderStatusEnum('status').notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    messageId: text('message_id'),
    requestedBy: uuid('requested_by')
      .notNull()
      .references(() => users.id),
    requestedAt: timestamp('requested_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
  },
  (t) => [
    index('lab_prescription_mails_prescription_idx').on(t.labPrescriptionId, t.requestedAt),
    uniqueIndex('lab_prescription_mails_one_pending')
      .on(t.labPrescriptionId)
      .where(sql`${t.status} = 'pending'`),
  ],
);

/** Complications, linked to the site and, where known, the part. */
export const complications = pgTable(
  'complications',
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
    componentInstanceId: uuid('component_instance_id').references(() => componentInstances.id),
    kind: complicationKindEnum('kind').notNull(),
    occurredOn: date('occurred_on', { mode: 'string' }).notNull(),
    notes: text('notes'),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('complications_site_idx').on(t.siteId),
    index('complications_patient_idx').on(t.patientId),
    index('complications_instance_idx')
      .on(t.componentInstanceId)
      .where(sql`${t.componentInstanceId} is not null`),
    ...amendmentChain('complications', t),
  ],
);

/**
 * A retentive insert (or bar clip) changed at one site of a delivered overdenture: the catalogue
 * part taken out (when known) and the one put in. Amended by a superseding row, never overwritten.
 */
export const insertChanges = pgTable(
  'insert_changes',
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
    /** The overdenture (the version current when the change was first logged). */
    restorationId: uuid('restoration_id')
      .notNull()
      .references(() => restorations.id),
    changedOn: date('changed_on', { mode: 'string' }).notNull(),
    oldComponentId: uuid('old_component_id').references(() => components.id),
    newComponentId: uuid('new_component_id')
      .notNull()
      .references(() => components.id),
    reason: insertChangeReasonEnum('reason').notNull(),
    notes: text('notes'),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('insert_changes_restoration_idx').on(t.restorationId),
    index('insert_changes_site_idx').on(t.siteId, t.changedOn),
    index('insert_changes_patient_idx').on(t.patientId),
    ...amendmentChain('insert_changes', t),
  ],
);
