import './records-out.css';
import { AnchorButton, Button, Callout } from '@blueprintjs/core';
import { subject } from '@torquetrail/authz';
import { useAppAbility } from '../../../lib/ability';
import { formatDateTime } from '../../../lib/dates';
import { REMINDER_STATUS_LABEL } from '../../../lib/labels';
import { recordsOutLinks, useMailPassport, usePassportMails } from '../api/records-out-api';

interface Props {
  patientId: string;
  practiceId: string;
}

/** E-mailing the passport: offered only with the patient's consent and address, else the reason. */
function MailPassport({ patientId }: { patientId: string }) {
  const status = usePassportMails(patientId);
  const mail = useMailPassport(patientId);
  if (status.isPending) return <p className="muted">Checking whether the passport can be e-mailed…</p>;
  if (status.isError)
    return (
      <Callout intent="danger" data-testid="passport-mail-error">
        Could not check the e-mail consent: {status.error.message}{' '}
        <Button small text="Retry" onClick={() => void status.refetch()} />
      </Callout>
    );
  const blocked = status.data.emailBlockedReason;
  const last = status.data.mails[0];
  return (
    <div className="records-out__mail">
      <Button
        icon="envelope"
        text="E-mail the passport to the patient"
        disabled={blocked !== null}
        loading={mail.isPending}
        onClick={() => mail.mutate()}
        data-testid="mail-passport"
      />
      {blocked && (
        <span className="muted" data-testid="mail-passport-reason">
          {' '}
          {blocked}.
        </span>
      )}
      {mail.isError && (
        <span role="alert" data-testid="mail-passport-failed">
          {' '}
          Not sent: {mail.error.message}
        </span>
      )}
      {last && (
        <p className="muted" data-testid="passport-mail-status">
          Last request {formatDateTime(last.requestedAt)} to {last.sentTo}:{' '}
          {REMINDER_STATUS_LABEL[last.status].toLowerCase()}
          {last.status === 'pending' && ' (sent as soon as the mail server answers)'}
        </p>
      )}
    </div>
  );
}

/** The records that leave the practice: FHIR export, implant passport, retrieval card (by role). */
export function RecordsOutPanel({ patientId, practiceId }: Props) {
  const ability = useAppAbility();
  // subject() tags the object it is given: each check gets its own copy.
  const row = () => ({ practiceId, patientId });
  const canExport = ability.can('read', subject('PatientExport', row()));
  const canPassport = ability.can('read', subject('ImplantPassport', row()));
  const canMail = ability.can('create', subject('ImplantPassport', row()));
  if (!canExport && !canPassport) return null;
  const links = recordsOutLinks(patientId);
  return (
    <section className="records-out" aria-labelledby="records-out-heading">
      <h2 id="records-out-heading">Records for the patient and other clinics</h2>
      <div className="records-out__links">
        {canPassport && (
          <>
            <AnchorButton
              icon="id-number"
              href={links.passport}
              text="Implant passport (PDF)"
              data-testid="download-passport"
            />
            <AnchorButton
              icon="wrench"
              href={links.retrievalCard}
              text="Retrieval card (PDF)"
              data-testid="download-retrieval-card"
            />
          </>
        )}
        {canExport && (
          <AnchorButton icon="export" href={links.fhir} text="FHIR R4 export (JSON)" data-testid="download-fhir" />
        )}
      </div>
      {canMail && <MailPassport patientId={patientId} />}
    </section>
  );
}
