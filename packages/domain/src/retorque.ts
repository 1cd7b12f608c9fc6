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
import { RETIGHTEN_AFTER_MINUTES, type TorqueReason } from './torque.js';

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
  const retorqued = entries.some((e) => RETORQUE_REASONS.includes(e.reason) && e.performedAt >= seating.performedAt);
  return retorqued ? null : new Date(seating.performedAt.getTime() + RETIGHTEN_AFTER_MINUTES * 60_000).toISOString();
}
