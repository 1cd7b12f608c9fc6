import { z } from 'zod';
import { FdiPosition, Id, IsoDate, IsoDateTime } from './common.js';
import {
  ComponentKind,
  Connection,
  InterfaceKind,
  LoadingProtocol,
  MaintenanceStatus,
  Material,
  RestorationKind,
  Retention,
  SiteStatus,
  TorqueReason,
  TorqueVerdict,
} from './enums.js';
import { SeatingSummary } from './seating.js';
import { SiteInsertChanges } from './insert-changes.js';

export const Placement = z.object({
  placedOn: IsoDate,
  surgeonName: z.string(),
  systemName: z.string(),
  manufacturer: z.string(),
  platformName: z.string(),
  diameterMm: z.number(),
  lengthMm: z.number(),
  connection: Connection,
  platformShift: z.boolean(),
  lot: z.string().nullable(),
  /** What the surgeon recorded from the implant's label: the UDI and what it carries (GS1 AIs 01, 21, 17). */
  udi: z.string().nullable(),
  gtin: z.string().nullable(),
  serial: z.string().nullable(),
  expiry: IsoDate.nullable(),
  /**
   * The system the catalogue knows the GTIN for when it is not the chosen platform's system: a
   * wrong system chosen, or a label of another implant scanned. Null when they agree or unknown.
   */
  gtinOtherSystem: z.string().nullable(),
  insertionTorqueNcm: z.number().nullable(),
  stabilityIsq: z.number().nullable(),
  loadingProtocol: LoadingProtocol.nullable(),
  grafting: z.string().nullable(),
  /** Free text, possibly another role's: absent from a share's reply (packages/authz shared-fields). */
  notes: z.string().nullable().optional(),
});
export type Placement = z.infer<typeof Placement>;

export const TorqueEventSummary = z.object({
  id: Id,
  appliedNcm: z.number(),
  specNcm: z.number(),
  tolerancePct: z.number(),
  verdict: TorqueVerdict,
  reason: TorqueReason,
  performedAt: IsoDateTime,
  /** Recorded with a wrench whose calibration was overdue: the verdict carries the flag. */
  wrenchCalibrationOverdue: z.boolean().optional(),
});
export type TorqueEventSummary = z.infer<typeof TorqueEventSummary>;

/** One physical part in the Stack, with its specification and its latest torque. */
export const StackPart = z.object({
  instanceId: Id,
  kind: ComponentKind,
  name: z.string(),
  referenceCode: z.string(),
  engaging: z.boolean().nullable(),
  angleDeg: z.number().nullable(),
  /** null = hand-tight (no torque specification). */
  torqueSpecNcm: z.number().nullable(),
  tolerancePct: z.number(),
  lot: z.string().nullable(),
  installedOn: IsoDate,
  lastTorque: TorqueEventSummary.nullable(),
  /** The catalogue part, and whether its lot must be recorded (e.g. when a screw is replaced). */
  componentId: Id.optional(),
  requiresLot: z.boolean().optional(),
  /**
   * Set after an initial seating until a re-torque is logged for this part: when the re-torque
   * is due (RETIGHTEN_AFTER_MINUTES after the seating).
   */
  retorqueDueAt: IsoDateTime.nullable().optional(),
  /**
   * The part has a torque specification and no seating torque was ever logged on it (initial
   * seating or replacement): `seatingTorqueMissing` in @torquetrail/domain. Absent where the role
   * may not read torque.
   */
  seatingTorqueMissing: z.boolean().optional(),
  /**
   * The part is shown as installed (name, spec and tolerance of that catalogue version, ADR 0006);
   * when the catalogue has been edited since, its current version, which new torque entries use.
   */
  newerVersion: z
    .object({
      componentId: Id,
      name: z.string(),
      torqueSpecNcm: z.number().nullable(),
      tolerancePct: z.number(),
      versionedAt: IsoDateTime,
    })
    .nullable()
    .optional(),
});
export type StackPart = z.infer<typeof StackPart>;

export const StackRestoration = z.object({
  id: Id,
  kind: RestorationKind,
  retention: Retention,
  material: Material,
  interface: InterfaceKind,
  deliveredOn: IsoDate.nullable(),
  /** A provisional awaiting its definitive restoration, planned for `plannedReplacementOn`. */
  provisional: z.boolean(),
  plannedReplacementOn: IsoDate.nullable(),
  /** Cement-retained restorations are not retrievable without cutting. */
  retrievable: z.boolean(),
  /** FDI positions of all sites this restoration spans. */
  spansFdi: z.array(FdiPosition),
  /** The current radiographic check of the delivery's seating; null = not checked radiographically. */
  seating: SeatingSummary.nullable(),
});
export type StackRestoration = z.infer<typeof StackRestoration>;

export const SiteFile = z.object({
  id: Id,
  patientId: Id,
  patientName: z.string(),
  fdi: FdiPosition,
  status: SiteStatus,
  maintenanceStatus: MaintenanceStatus,
  placement: Placement.nullable(),
  /** Parts from the implant outward: abutment or multi-unit, then screws. */
  parts: z.array(StackPart),
  restoration: StackRestoration.nullable(),
  /**
   * The insert changes of a site of a delivered overdenture (null on other sites). Absent for a
   * shared surgeon [decision: insert maintenance is the practice's own follow-up].
   */
  insertChanges: SiteInsertChanges.nullable().optional(),
});
export type SiteFile = z.infer<typeof SiteFile>;
