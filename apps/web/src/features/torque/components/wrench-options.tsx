import { Callout } from '@blueprintjs/core';
import { WRENCH_TYPE_LABEL } from '../../../lib/clinical-labels';
import { formatDate } from '../../../lib/dates';
import { useWrenches } from '../api/wrenches';

/** The options of a wrench select: "Not recorded", then each wrench with its type and calibration. */
export function WrenchOptions() {
  const wrenches = useWrenches();
  return (
    <>
      <option value="">Not recorded</option>
      {wrenches.data?.items.map((w) => (
        <option key={w.id} value={w.id}>
          {w.label} ({WRENCH_TYPE_LABEL[w.type].toLowerCase()}
          {w.lastCalibratedOn ? `, calibrated ${formatDate(w.lastCalibratedOn)}` : ', calibration not recorded'}
          {w.calibrationOverdue ? ', calibration overdue' : ''})
        </option>
      ))}
    </>
  );
}

/**
 * Beside the wrench: a wrench whose calibration is overdue under the practice's interval (or was
 * never recorded) can still be used, but every torque recorded with it carries the flag.
 */
export function WrenchCalibrationWarning({ wrenchId }: { wrenchId: string }) {
  const wrenches = useWrenches();
  const wrench = wrenches.data?.items.find((w) => w.id === wrenchId);
  if (!wrench?.calibrationOverdue) return null;
  const months = wrenches.data?.calibrationIntervalMonths ?? 0;
  return (
    <Callout intent="warning" icon="warning-sign" compact data-testid="wrench-calibration-overdue">
      {wrench.calibrationDueOn
        ? `The calibration of ${wrench.label} ran out on ${formatDate(wrench.calibrationDueOn)}`
        : `No calibration of ${wrench.label} is recorded`}{' '}
      (the practice recalibrates every {months} month{months === 1 ? '' : 's'}): its readings may be off. The torque is
      saved with a calibration-overdue flag beside its verdict.
    </Callout>
  );
}
