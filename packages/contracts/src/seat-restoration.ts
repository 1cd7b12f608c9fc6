// Seat restoration: every screw of a delivered restoration torqued in one form and saved in one
// transaction, with one wrench and one time for all; each screw judged against its own spec.
import { z } from 'zod';
import { FdiPosition, Id, IsoDate, IsoDateTime } from './common.js';
import { ComponentKind } from './enums.js';
import { AppliedNcm, TorqueEvent } from './ledger-torque.js';
import type { RouteContract } from './route-contract.js';

/** A part of the restoration in place with a torque specification (the catalogue's current version). */
export const RestorationScrew = z.object({
  instanceId: Id,
  siteId: Id,
  fdi: FdiPosition,
  kind: ComponentKind,
  name: z.string(),
  referenceCode: z.string(),
  torqueSpecNcm: z.number(),
  tolerancePct: z.number(),
  /** The latest seating logged on it (initial seating or replacement); null = its seating torque is missing. */
  seatedAt: IsoDateTime.nullable(),
});
export type RestorationScrew = z.infer<typeof RestorationScrew>;

export const RestorationScrewsReply = z.object({
  restorationId: Id,
  deliveredOn: IsoDate.nullable(),
  items: z.array(RestorationScrew),
});
export type RestorationScrewsReply = z.infer<typeof RestorationScrewsReply>;

const SeatScrew = z.object({ componentInstanceId: Id, appliedNcm: AppliedNcm });
export const SeatRestorationBody = z.object({
  wrenchId: Id.nullable().default(null),
  /** One time for every screw; defaults to now. */
  performedAt: IsoDateTime.nullable().default(null),
  screws: z.array(SeatScrew).min(1, 'Enter the applied torque of at least one screw').max(64),
});
export type SeatRestorationBody = z.input<typeof SeatRestorationBody>;

export const SeatRestorationReply = z.object({ items: z.array(TorqueEvent) });
export type SeatRestorationReply = z.infer<typeof SeatRestorationReply>;

const r = (method: RouteContract['method'], path: string, summary: string, more: Partial<RouteContract> = {}) =>
  ({ method, path, summary, signedIn: true, ...more }) satisfies RouteContract;

export const seatRestorationRoutes: RouteContract[] = [
  r('get', '/restorations/:id/screws', 'The torqued parts of a delivered restoration, each with its spec and seating', {
    reply: RestorationScrewsReply,
  }),
  r(
    'post',
    '/restorations/:id/seat',
    'Seat a restoration: the initial seating torque of each screw, one wrench and time, in one transaction',
    { body: SeatRestorationBody, reply: SeatRestorationReply },
  ),
];
