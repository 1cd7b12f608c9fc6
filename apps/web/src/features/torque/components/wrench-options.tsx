import { WRENCH_TYPE_LABEL } from '../../../lib/clinical-labels';
import { useWrenches } from '../api/wrenches';

/** The options of a wrench select: "Not recorded", then each wrench with its type and last calibration. */
export function WrenchOptions() {
  const wrenches = useWrenches();
  return (
    <>
      <option value="">Not recorded</option>
      {wrenches.data?.items.map((w) => (
        <option key={w.id} value={w.id}>
          {w.label} ({WRENCH_TYPE_LABEL[w.type].toLowerCase()}
          {w.lastCalibratedOn ? `, calibrated ${w.lastCalibratedOn}` : ', calibration not recorded'})
        </option>
      ))}
    </>
  );
}
