// Checks shared by every way a torque is recorded (one entry, an amendment, a whole restoration).
import { ConflictException } from '@nestjs/common';
import type { DateFormat, TorqueEvent } from '@torquetrail/contracts';
import { calibrationOverdue } from '@torquetrail/domain';
import { fieldError } from '../common/field-error.js';
import { datePrinter } from '../common/printed-dates.js';
import type { Database, Tx } from '../db/database.js';
import * as repo from './torque.repository.js';

/** An entry may be a few minutes ahead of the server clock, never later. */
const FUTURE_SLACK_MS = 5 * 60_000;

/** A part already removed is refused, its removal date in the signed-in user's practice's order. */
export function assertInPlace(
  part: { removedOn: string | null; enteredInErrorAt: Date | null },
  dateFormat: DateFormat,
) {
  // A part entered in error was never fitted (parts-in-place.ts).
  if (part.enteredInErrorAt)
    throw new ConflictException('This part was entered in error; log the torque on the part in place');
  if (part.removedOn)
    throw new ConflictException(
      `This part was removed on ${datePrinter(dateFormat).date(part.removedOn)}; log the torque on the part in place`,
    );
}

export function checkWhen(performedAt: Date, field: string) {
  if (performedAt.getTime() > Date.now() + FUTURE_SLACK_MS) throw fieldError({ [field]: 'Cannot be in the future' });
}

/**
 * The current version of the wrench (new work, ADR 0006), or a 400 when it is not the practice's,
 * and whether its calibration was overdue on the day of the torque (calibrationOverdue with the
 * practice's interval; the latest calibration on or before that day).
 */
export async function currentWrench(db: Tx | Database, practiceId: string, wrenchId: string | null, performedAt: Date) {
  if (!wrenchId) return { wrenchId: null, wrenchCalibrationOverdue: false };
  const wrench = await repo.findWrenchOfPractice(db, practiceId, wrenchId);
  if (!wrench) throw fieldError({ wrenchId: 'Not a torque wrench of this practice' });
  const day = performedAt.toISOString().slice(0, 10);
  const { intervalMonths, lastCalibratedOn } = await repo.wrenchCalibrationOn(db, practiceId, wrench.lineageId, day);
  return { wrenchId: wrench.id, wrenchCalibrationOverdue: calibrationOverdue(lastCalibratedOn, intervalMonths, day) };
}

/** A saved torque entry as the API replies with it. */
export async function torqueReply(db: Database, id: string, replacing: boolean): Promise<TorqueEvent> {
  const e = await repo.loadTorqueEvent(db, id);
  return {
    ...e,
    performedAt: e.performedAt.toISOString(),
    replacementInstanceId: replacing ? e.componentInstanceId : null,
  };
}
