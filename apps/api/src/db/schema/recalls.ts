import { sql } from 'drizzle-orm';
import {
  boolean,
  date,
  index,
  integer,
  json,
  jsonb,
  numeric,
  pgTable,
  smallint,
  text,
  timestamp,
  unique,
  uuid,
} from 'drizzle-orm/pg-core';
import { amendmentChain } from './amendment-chain.js';
import {
  DEFAULT_OVERDUE_REMINDER_DAYS_AFTER,
  DEFAULT_RECALL_MONTHS,
  DEFAULT_REMINDER_DAYS_BEFORE,
  DEFAULT_RISK_RECALL_MONTHS,
} from '@torquetrail/domain';
import {
  periImplantStatusEnum,
  probingSiteEnum,
  recallStatusEnum,
  reminderKindEnum,
  reminderStatusEnum,
} from './enums.js';
import { patients } from './patients.js';
import { radiographMeasurements } from './radiographs.js';
import { practices, users } from './practices.js';
import { implantSites } from './sites.js';

/**
 * One maintenance exam of one implant site. Several sites examined in one visit share a visitId.
 * The computed status is stored with the rule version and options used (classifyPeriImplant).
 */
export const recallExams = pgTable(
  'recall_exams',
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
    visitId: uuid('visit_id').notNull(),
    examinedOn: date('examined_on', { mode: 'string' }).notNull(),
    examinerId: uuid('examiner_id')
      .notNull()
      .references(() => users.id),
    mobility: boolean('mobility').notNull(),
    /** Modified plaque index and modified bleeding index, 0–3. */
    plaqueIndex: smallint('plaque_index'),
    bleedingIndex: smallint('bleeding_index'),
    keratinizedMucosaMm: numeric('keratinized_mucosa_mm', { precision: 3, scale: 1, mode: 'number' }),
    residualCement: boolean('residual_cement').notNull().default(false),
    /** Radiographic bone level, mm apical to the most coronal intra-osseous part, when known. */
    boneLevelMm: numeric('bone_level_mm', { precision: 4, scale: 1, mode: 'number' }),
    /** The radiograph measurement the bone level was accepted from; null when it was typed. */
    boneLevelMeasurementId: uuid('bone_level_measurement_id').references(() => radiographMeasurements.id),
    isBaseline: boolean('is_baseline').notNull().default(false),
    notes: text('notes'),
    status: periImplantStatusEnum('status').notNull(),
    reasons: jsonb('reasons').$type<string[]>().notNull(),
    flags: jsonb('flags').$type<string[]>().notNull(),
    rulesVersion: text('rules_version').notNull(),
    ruleOptions: jsonb('rule_options').$type<Record<string, number>>().notNull(),
    supersedesId: uuid('supersedes_id'),
    amendmentReason: text('amendment_reason'),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
    /** The exam this one was compared with (null: the no-baseline definition was used). */
    baselineExamId: uuid('baseline_exam_id'),
  },
  (t) => [
    index('recall_exams_bone_level_measurement_idx')
      .on(t.boneLevelMeasurementId)
      .where(sql`${t.boneLevelMeasurementId} is not null`),
    index('recall_exams_site_idx').on(t.siteId, t.examinedOn),
    index('recall_exams_patient_idx').on(t.patientId, t.examinedOn),
    // The desk sorted by last exam walks the practice's exams newest first and stops at the page.
    index('recall_exams_practice_examined_idx').on(t.practiceId, t.examinedOn),
    // The desk's "peri-implantitis last time" starts from the few such exams of the practice
    // instead of every exam (recalls/desk.repository.ts).
    index('recall_exams_peri_implantitis_idx')
      .on(t.practiceId, t.siteId)
      .where(sql`${t.status} = 'peri-implantitis'`),
    // "Current" = not superseded: the not-exists probe on large desks uses the chain's unique index.
    ...amendmentChain('recall_exams', t),
  ],
);

/** Probing at one of the six sites around the implant. */
export const recallExamSites = pgTable(
  'recall_exam_sites',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    examId: uuid('exam_id')
      .notNull()
      .references(() => recallExams.id),
    position: probingSiteEnum('position').notNull(),
    probingDepthMm: numeric('probing_depth_mm', { precision: 3, scale: 1, mode: 'number' }).notNull(),
    bleeding: boolean('bleeding').notNull(),
    suppuration: boolean('suppuration').notNull(),
  },
  (t) => [unique('recall_exam_sites_exam_position_unique').on(t.examId, t.position)],
);

/** The next maintenance visit of a patient, scheduled from the last exam and the practice policy. */
export const recalls = pgTable(
  'recalls',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    dueOn: date('due_on', { mode: 'string' }).notNull(),
    status: recallStatusEnum('status').notNull().default('scheduled'),
    scheduledFromVisitId: uuid('scheduled_from_visit_id'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('recalls_practice_due_idx').on(t.practiceId, t.status, t.dueOn),
    index('recalls_patient_idx').on(t.patientId),
  ],
);

/** Practice policy for recall intervals and reminders (edited by the practice admin). */
export const recallPolicies = pgTable('recall_policies', {
  practiceId: uuid('practice_id')
    .primaryKey()
    .references(() => practices.id),
  baseMonths: smallint('base_months').notNull().default(DEFAULT_RECALL_MONTHS),
  riskMonths: smallint('risk_months').notNull().default(DEFAULT_RISK_RECALL_MONTHS),
  reminderDaysBefore: smallint('reminder_days_before').notNull().default(DEFAULT_REMINDER_DAYS_BEFORE),
  overdueReminderDaysAfter: smallint('overdue_reminder_days_after')
    .notNull()
    .default(DEFAULT_OVERDUE_REMINDER_DAYS_AFTER),
  updatedBy: uuid('updated_by').references(() => users.id),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** Every reminder e-mail: one row per patient, recall date and kind (the idempotency key). */
export const reminderLog = pgTable(
  'reminder_log',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    recallDueOn: date('recall_due_on', { mode: 'string' }).notNull(),
    kind: reminderKindEnum('kind').notNull(),
    idempotencyKey: text('idempotency_key').notNull(),
    status: reminderStatusEnum('status').notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    messageId: text('message_id'),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('reminder_log_patient_idx').on(t.patientId),
    unique('reminder_log_idempotency_unique').on(t.idempotencyKey),
    index('reminder_log_practice_idx').on(t.practiceId, t.createdAt),
  ],
);

/**
 * The Recall desk's read model (ADR 0009): one row per patient with what the desk filters and
 * sorts on, kept by PostgreSQL triggers in the transaction of every write to its sources
 * (patients, implant_sites, recall_exams, recalls, restorations; see the migration
 * `recall-summaries`), never written by the app. Derived data, not a clinical entry: a row is
 * recomputed from its sources whole (recall_summary_refresh), so it can always be rebuilt.
 * A new desk filter adds a column here and its expression to recall_summary_refresh.
 */
export const recallSummaries = pgTable(
  'recall_summaries',
  {
    patientId: uuid('patient_id')
      .primaryKey()
      .references(() => patients.id, { onDelete: 'cascade' }),
    practiceId: uuid('practice_id').notNull(),
    familyName: text('family_name').notNull(),
    givenName: text('given_name').notNull(),
    archived: boolean('archived').notNull().default(false),
    /** The patient has an implant site placed or restored: the desk lists them. */
    onDesk: boolean('on_desk').notNull().default(false),
    /** Earliest scheduled recall. */
    nextDue: date('next_due', { mode: 'string' }),
    /** Latest current (not amended) exam. */
    lastExamOn: date('last_exam_on', { mode: 'string' }),
    /** A current exam of any site found peri-implantitis. */
    priorPeriImplantitis: boolean('prior_peri_implantitis').notNull().default(false),
    /** An examinable site whose latest current exam found peri-implantitis. */
    periImplantitisLast: boolean('peri_implantitis_last').notNull().default(false),
    /** Earliest planned replacement of a delivered provisional. */
    provisionalDue: date('provisional_due', { mode: 'string' }),
    /** Each examinable site by FDI with its latest current exam's status and date, as the desk shows it. */
    sites: json('sites')
      .notNull()
      .default(sql`'[]'::json`),
    /**
     * The sites as the CSV export's cell writes them ("fdi: status; …", `not-examined` for a site
     * never examined), kept by PostgreSQL from `sites` (desk_sites_text, migration
     * `0040_desk-sites-text`): the export reads it instead of parsing every row's JSON (issue 13).
     */
    sitesText: text('sites_text')
      .notNull()
      .generatedAlwaysAs(sql`public.desk_sites_text(sites)`),
  },
  (t) => {
    const onDesk = sql`${t.onDesk}`;
    const names = [t.familyName, t.givenName, t.patientId] as const;
    // One index per order, in the order's exact terms (nulls last either way, ties by name), after
    // the practice and the archived flag (the desk shows active patients unless asked): a first
    // page is the first rows of one index, and a count reads the practice's entries of one index
    // (index-only). Partial on the desk's rows.
    const byKey = (name: string, ...columns: Parameters<ReturnType<typeof index>['on']>[number][]) =>
      index(name)
        .on(t.practiceId, t.archived, ...columns, ...names)
        .where(onDesk);
    return [
      byKey('recall_summaries_name_idx'),
      byKey('recall_summaries_due_asc_idx', t.nextDue.asc().nullsLast()),
      byKey('recall_summaries_due_desc_idx', t.nextDue.desc().nullsLast()),
      byKey('recall_summaries_exam_asc_idx', t.lastExamOn.asc().nullsLast()),
      byKey('recall_summaries_exam_desc_idx', t.lastExamOn.desc().nullsLast()),
      index('recall_summaries_pi_last_idx')
        .on(t.practiceId, t.archived, ...names)
        .where(sql`${t.onDesk} and ${t.periImplantitisLast}`),
      index('recall_summaries_provisional_idx')
        .on(t.practiceId, t.archived, t.provisionalDue)
        .where(sql`${t.onDesk} and ${t.provisionalDue} is not null`),
    ];
  },
);
