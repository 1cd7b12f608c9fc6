// Torque entries, complications and the Site file's Timeline.
import { z } from 'zod';
import { keepingOmitted } from './amendment.js';
import { Id, IsoDate, IsoDateTime, NoteText, PlainText } from './common.js';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { ComplicationKind, TimelineKind, TorqueReason, TorqueVerdict } from './enums.js';

const torqueRangeMessage = `Torque must be between ${TORQUE_NCM_RANGE.min} and ${TORQUE_NCM_RANGE.max} N·cm`;
/** An applied torque, N·cm, within the accepted range. */
export const AppliedNcm = z
  .number({ error: 'Enter the applied torque in N·cm' })
  .min(TORQUE_NCM_RANGE.min, torqueRangeMessage)
  .max(TORQUE_NCM_RANGE.max, torqueRangeMessage);

export const TorqueBody = z.object({
  componentInstanceId: Id,
  appliedNcm: AppliedNcm,
  wrenchId: Id.nullable().default(null),
  reason: TorqueReason,
  /** Defaults to now. */
  performedAt: IsoDateTime.nullable().default(null),
  /** For 'screw-replaced': the lot of the new screw (required when the part requires lots). */
  replacementLot: PlainText(40).nullable().default(null),
  /**
   * A re-torque after settling earlier than the settling time is refused until the clinician
   * confirms it (earlySettlingRetorque in @torquetrail/domain); the confirmation is stored.
   */
  confirmEarlySettling: z.boolean().default(false),
});
export type TorqueBody = z.input<typeof TorqueBody>;

/** The corrected reading; the wrench and the time, left out, are kept. */
export const TorqueAmendmentBody = z.object({
  ...keepingOmitted({
    appliedNcm: AppliedNcm,
    wrenchId: Id.nullable().default(null),
    performedAt: IsoDateTime.optional(),
  }),
  amendmentReason: NoteText(500).min(3, 'Say why the entry is amended'),
});
export type TorqueAmendmentBody = z.input<typeof TorqueAmendmentBody>;

export const TorqueEvent = z.object({
  id: Id,
  componentInstanceId: Id,
  appliedNcm: z.number(),
  specNcm: z.number(),
  tolerancePct: z.number(),
  verdict: TorqueVerdict,
  rulesVersion: z.string(),
  reason: TorqueReason,
  wrenchId: Id.nullable(),
  wrenchLabel: z.string().nullable(),
  /** The wrench's calibration was overdue (or never recorded) when the torque was recorded. */
  wrenchCalibrationOverdue: z.boolean(),
  /** A settling re-torque earlier than the settling time, confirmed by the clinician. */
  earlySettlingConfirmed: z.boolean(),
  performedAt: IsoDateTime,
  recordedByName: z.string().nullable(),
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable().optional(),
  /** For 'screw-replaced': the new part instance the torque was applied to. */
  replacementInstanceId: Id.nullable(),
});
export type TorqueEvent = z.infer<typeof TorqueEvent>;

export const ComplicationBody = z.object({
  siteId: Id,
  componentInstanceId: Id.nullable().default(null),
  kind: ComplicationKind,
  occurredOn: IsoDate,
  notes: NoteText(2000).nullable().default(null),
});
export type ComplicationBody = z.input<typeof ComplicationBody>;
/** A new version: a field left out keeps its value, `null` clears it. */
export const ComplicationAmendmentBody = z.object({
  ...keepingOmitted(ComplicationBody.omit({ siteId: true }).shape),
  amendmentReason: NoteText(500).min(3, 'Say why the entry is amended'),
});
export type ComplicationAmendmentBody = z.input<typeof ComplicationAmendmentBody>;

export const Complication = z.object({
  id: Id,
  siteId: Id,
  componentInstanceId: Id.nullable(),
  kind: ComplicationKind,
  occurredOn: IsoDate,
  notes: z.string().nullable(),
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable().optional(),
  recordedByName: z.string().nullable(),
});
export type Complication = z.infer<typeof Complication>;

export const TimelineEvent = z.object({
  /** `${kind}:${row id}` (a part can appear twice: installed and removed). */
  key: z.string(),
  id: Id,
  kind: TimelineKind,
  /** Instant of the event; date-only events are at 00:00 UTC with `dateOnly`. */
  at: IsoDateTime,
  dateOnly: z.boolean(),
  title: z.string(),
  /** A share's reply keeps the detail only where it is computed, never a note or an address. */
  detail: z.string().nullable().optional(),
  /** A newer version replaced this entry; it stays visible, marked as amended. */
  amended: z.boolean(),
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable().optional(),
  componentInstanceId: Id.nullable(),
  verdict: TorqueVerdict.nullable(),
  /** The entry's own code: a complication's kind, a torque entry's reason; null otherwise. */
  code: z.string().nullable(),
  /** Torque entries: the applied value, N·cm. */
  appliedNcm: z.number().nullable(),
  /** Torque entries: recorded with a wrench whose calibration was overdue (the verdict carries the flag). */
  wrenchCalibrationOverdue: z.boolean().optional(),
  /** Torque entries: an early settling re-torque the clinician confirmed. */
  earlySettlingConfirmed: z.boolean().optional(),
  byName: z.string().nullable().optional(),
  /** Radiograph, bone-level and seating-check entries: the radiograph to show and open. */
  radiographId: Id.nullable(),
  /** A radiograph marked entered in error stays in the Timeline, marked, with the reason. */
  enteredInErrorReason: z.string().nullable().optional(),
  /** An entry brought in by a legacy import: "FILE, row N" (docs/import.md); null otherwise. */
  importedFrom: z.string().nullable().optional(),
});
export type TimelineEvent = z.infer<typeof TimelineEvent>;

export const TorqueSeries = z.object({
  componentInstanceId: Id,
  label: z.string(),
  specNcm: z.number().nullable(),
  tolerancePct: z.number(),
  removedOn: IsoDate.nullable(),
  points: z.array(
    z.object({
      id: Id,
      at: IsoDateTime,
      appliedNcm: z.number(),
      /** The spec and tolerance this entry was judged against, as stored with it (ADR 0006). */
      specNcm: z.number(),
      tolerancePct: z.number(),
      verdict: TorqueVerdict,
      reason: TorqueReason,
    }),
  ),
});
export type TorqueSeries = z.infer<typeof TorqueSeries>;

export const TimelineQuery = z.object({
  /** Comma-separated kinds to keep; all when omitted. */
  kinds: PlainText(200)
    .optional()
    .transform((s, ctx) => {
      if (!s) return undefined;
      const parts = s
        .split(',')
        .map((p) => p.trim())
        .filter(Boolean);
      for (const p of parts) {
        if (!TimelineKind.safeParse(p).success) {
          ctx.addIssue({ code: 'custom', message: `Unknown kind "${p}"` });
          return z.NEVER;
        }
      }
      return parts as TimelineKind[];
    }),
});
export type TimelineQuery = z.output<typeof TimelineQuery>;

export const TimelineReply = z.object({
  siteId: Id,
  events: z.array(TimelineEvent),
  torqueSeries: z.array(TorqueSeries),
});
export type TimelineReply = z.infer<typeof TimelineReply>;
