import type { PatientDetail } from '@torquetrail/contracts';
import { subject } from '@torquetrail/authz';
import { Can } from '../../../lib/ability';
import { PatientAccessLog } from '../../audit';
import { ReferralSummaryPanel } from '../../outcomes';
import { RecordsOutPanel } from '../../records-out';
import { PatientShares } from '../../shares';

/**
 * The panels below the implant sites: referral summary, shares, records out, the access trail.
 * A chunk of its own (the default export, for `lazy`), loaded after the Arch has shown.
 */
export default function PatientPanels({ patient }: { patient: PatientDetail }) {
  return (
    <>
      <Can I="read" this={subject('ReferralSummary', { practiceId: patient.practiceId, patientId: patient.id })}>
        <ReferralSummaryPanel patientId={patient.id} />
      </Can>
      <Can I="read" this={subject('Share', { practiceId: patient.practiceId, patientId: patient.id })}>
        <PatientShares patient={patient} />
      </Can>
      <RecordsOutPanel patientId={patient.id} practiceId={patient.practiceId} />
      <Can I="read" this={subject('PatientAudit', { practiceId: patient.practiceId, patientId: patient.id })}>
        <PatientAccessLog patientId={patient.id} />
      </Can>
    </>
  );
}
