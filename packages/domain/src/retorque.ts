/**
 * The re-torque reminder after a screw is seated.
 *
 * Screws lose 2–10 % of their preload as the contact surfaces settle; tightening them again about
 * 10 minutes after the first tightening restores it (Siamos G, Winkler S, Boberick KG 2002,
 * J Oral Implantol 28:67–73) [pub]. The delay is {@link RETIGHTEN_AFTER_MINUTES}.
 *
 * Decisions (also in docs/clinical-rules.md): a replaced screw is a new seating; a re-torque after
 * settling or at a recall, logged at or after the latest seating, answers it; a re-torque logged
 * before the seating does not.
 */
import type { TorqueReason } from './choices.js';
import { RETIGHTEN_AFTER_MINUTES } from './torque.js';

/** Reasons that seat a screw (its preload will settle) [decision: a replaced screw is seated anew]. */
export const SEATING_REASONS: readonly TorqueReason[] = Object.freeze(['initial-seating', 'screw-replaced']);
/** Reasons that re-tighten a seated screw. */
export const RETORQUE_REASONS: readonly TorqueReason[] = Object.freeze([
  're-torque-after-settling',
  're-torque-at-recall',
]);

/** One logged torque of a part, in the order logged. */
export interface TorqueLogEntry {
  reason: TorqueReason;
  performedAt: Date;
}

/**
 * When the re-torque after the latest seating is due, as an ISO instant: the seating +
 * RETIGHTEN_AFTER_MINUTES (Siamos et al. 2002); null when nothing was seated or a re-torque
 * at or after the seating is logged.
 */
export function retorqueDueAt(entries: readonly TorqueLogEntry[]): string | null {
  const seating = [...entries].reverse().find((e) => SEATING_REASONS.includes(e.reason));
  if (!seating) return null;
  const retorqueLogged = entries.some(
    (e) => RETORQUE_REASONS.includes(e.reason) && e.performedAt >= seating.performedAt,
  );
  return retorqueLogged
    ? null
    : new Date(seating.performedAt.getTime() + RETIGHTEN_AFTER_MINUTES * 60_000).toISOString();
}

/**
 * A part with a torque specification that has never been seated by a logged torque (neither an
 * initial seating nor a replacement): its seating torque is missing [decision: a delivered screw
 * whose seating was not recorded cannot be shown to have been tightened to its specification].
 */
export function seatingTorqueMissing(torqueSpecNcm: number | null, entries: readonly TorqueLogEntry[]): boolean {
  return torqueSpecNcm !== null && !entries.some((e) => SEATING_REASONS.includes(e.reason));
}

/** A settling re-torque logged before RETIGHTEN_AFTER_MINUTES had passed since the seating it follows. */
export interface EarlySettlingRetorque {
  /** The seating the re-torque follows. */
  seatedAt: Date;
  /** Whole minutes between the seating and the re-torque. */
  minutesAfter: number;
}

/**
 * Whether a re-torque "after settling" at `performedAt` comes earlier than RETIGHTEN_AFTER_MINUTES
 * after the latest seating at or before it (Siamos et al. 2002: settling needs about 10 minutes)
 * [pub]; null when it does not, or when there is no such seating. Other reasons are never early.
 */
export function earlySettlingRetorque(
  reason: TorqueReason,
  performedAt: Date,
  entries: readonly TorqueLogEntry[],
): EarlySettlingRetorque | null {
  if (reason !== 're-torque-after-settling') return null;
  const seatings = entries.filter((e) => SEATING_REASONS.includes(e.reason) && e.performedAt <= performedAt);
  if (seatings.length === 0) return null;
  const seatedAt = new Date(Math.max(...seatings.map((e) => e.performedAt.getTime())));
  const elapsedMs = performedAt.getTime() - seatedAt.getTime();
  if (elapsedMs >= RETIGHTEN_AFTER_MINUTES * 60_000) return null;
  return { seatedAt, minutesAfter: Math.floor(elapsedMs / 60_000) };
}
