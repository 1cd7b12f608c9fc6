// Retentive-insert changes of an overdenture (issue 16 item 2) and the practice's insert review interval.
import { z } from 'zod';
import { INSERT_REVIEW_MONTHS_RANGE } from '@torquetrail/domain';
import { keepingOmitted } from './amendment.js';
import { Id, IsoDate, NoteText } from './common.js';
import { InsertChangeReason } from './enums.js';
import type { RouteContract } from './route-contract.js';

/** Log a change of the insert (or bar clip) at one site of a delivered overdenture. */
export const InsertChangeBody = z.object({
  siteId: Id,
  /** Not after today (400 beside the field). */
  changedOn: IsoDate,
  /** The insert taken out (a catalogue part), when known. */
  oldComponentId: Id.nullable().default(null),
  /** The insert put in (a catalogue part: a retentive insert, or a clip on a bar). */
  newComponentId: Id,
  reason: InsertChangeReason,
  notes: NoteText(2000).nullable().default(null),
});
export type InsertChangeBody = z.input<typeof InsertChangeBody>;

/** A new version: a field left out keeps its value, `null` clears it. */
export const InsertChangeAmendmentBody = z.object({
  ...keepingOmitted(InsertChangeBody.omit({ siteId: true }).shape),
  amendmentReason: NoteText(500).min(3, 'Say why the entry is amended'),
});
export type InsertChangeAmendmentBody = z.input<typeof InsertChangeAmendmentBody>;

/** A catalogue insert as the change names it, with the strength the catalogue states. */
export const InsertPart = z.object({
  componentId: Id,
  name: z.string(),
  /** The manufacturer's strength label (e.g. "medium"), as the practice's catalogue states it. */
  retentionLabel: z.string().nullable(),
  /** Retention force, N, when the catalogue states one. */
  retentionN: z.number().nullable(),
});
export type InsertPart = z.infer<typeof InsertPart>;

export const InsertChange = z.object({
  id: Id,
  siteId: Id,
  changedOn: IsoDate,
  oldPart: InsertPart.nullable(),
  newPart: InsertPart,
  reason: InsertChangeReason,
  notes: z.string().nullable(),
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable().optional(),
  recordedByName: z.string().nullable(),
});
export type InsertChange = z.infer<typeof InsertChange>;

/** The Site file's insert record: the interval since the last change, the counts and the review. */
export const SiteInsertChanges = z.object({
  restorationId: Id,
  deliveredOn: IsoDate,
  /** The practice's insert review interval, months. */
  reviewIntervalMonths: z.number().int(),
  lastChangeOn: IsoDate.nullable(),
  daysSinceLast: z.number().int().nullable(),
  monthsSinceLast: z.number().int().nullable(),
  /** Changes in the last 12 months (the days after the same day a year ago, up to today). */
  last12Months: z.number().int(),
  /** Changes per calendar year, oldest first. */
  perYear: z.array(z.object({ year: z.number().int(), count: z.number().int() })),
  /** The review falls due the interval after the last change of the overdenture's sites (or its delivery). */
  reviewDueOn: IsoDate,
  reviewOverdue: z.boolean(),
  /** The site's current changes (amended versions left out), newest first. */
  entries: z.array(InsertChange),
});
export type SiteInsertChanges = z.infer<typeof SiteInsertChanges>;

const intervalMessage = `Whole months from ${INSERT_REVIEW_MONTHS_RANGE.min} to ${INSERT_REVIEW_MONTHS_RANGE.max}`;
/** The practice's insert review interval (default 12 months [common practice]). */
export const InsertReviewSettings = z.object({
  insertReviewIntervalMonths: z
    .number({ error: 'Enter a number of months, e.g. 12' })
    .int({ error: intervalMessage })
    .min(INSERT_REVIEW_MONTHS_RANGE.min, { error: intervalMessage })
    .max(INSERT_REVIEW_MONTHS_RANGE.max, { error: intervalMessage }),
});
export type InsertReviewSettings = z.infer<typeof InsertReviewSettings>;

const r = (
  method: RouteContract['method'],
  path: string,
  summary: string,
  extra: Partial<RouteContract> = {},
): RouteContract => ({ method, path, summary, signedIn: true, ...extra });

export const insertChangeRoutes: RouteContract[] = [
  r('post', '/insert-changes', 'Log a retentive-insert change at a site of a delivered overdenture', {
    body: InsertChangeBody,
    reply: InsertChange,
  }),
  r('post', '/insert-changes/:id/amendments', 'Amend an insert change: a new version superseding it', {
    body: InsertChangeAmendmentBody,
    reply: InsertChange,
  }),
  r('get', '/practice/insert-review-settings', "The practice's insert review interval in months", {
    reply: InsertReviewSettings,
  }),
  r('put', '/practice/insert-review-settings', "Set the practice's insert review interval (practice admin)", {
    body: InsertReviewSettings,
    reply: InsertReviewSettings,
  }),
];
