import { AnchorButton, Button, Callout, Card, Classes, Tag } from '@blueprintjs/core';
import type { RestorationDetail } from '@torquetrail/contracts';
import { formatTooth } from '@torquetrail/domain';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { ImpressionPanel, ImpressionSummary } from '../../impressions';
import { formatDate, formatDateTime } from '../../../lib/dates';
import type { ToothSystem } from '../../../lib/tooth-system';
import { useLabPrescription } from '../api/planner-api';
import { DeliveryForm } from './delivery-form';
import { SeatRestorationForm } from '../../torque';
import {
  FINDING_SEVERITY_LABEL,
  IMPRESSION_COPING_LABEL,
  INTERFACE_LABEL,
  MATERIAL_LABEL,
  RESTORATION_KIND_LABEL as KIND_LABEL,
  RESTORATION_STATUS_LABEL,
  RETENTION_LABEL,
} from '../../../lib/clinical-labels';
import { REMINDER_STATUS_LABEL } from '../../../lib/labels';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';

/** One restoration: what was planned, its Findings, delivery and lab prescriptions. */
/** Downloads a PDF the way its link would, without a navigation that would cancel the page's refetches. */
function downloadPdf(href: string) {
  const link = document.createElement('a');
  link.href = href;
  link.download = '';
  link.click();
}

export function RestorationPanel({
  restoration: r,
  system,
  patientId,
}: {
  restoration: RestorationDetail;
  system: ToothSystem;
  patientId: string;
}) {
  const [delivering, setDelivering] = useState(false);
  // The delivery flow ends on the seating form: every screw's initial torque in one go.
  const [seating, setSeating] = useState(false);
  useCloseOnEscape(delivering, () => setDelivering(false));
  useCloseOnEscape(seating, () => setSeating(false));
  const lab = useLabPrescription(r);
  const current = !r.supersededById;
  return (
    <Card
      className={`restoration-card${current ? '' : ' restoration-card--amended'}`}
      data-testid="restoration-card"
      data-status={r.status}
    >
      <h2>
        {KIND_LABEL[r.kind]} · {r.sites.map((s) => formatTooth(s.fdi, system)).join(', ')}{' '}
        <Tag intent={r.status === 'delivered' ? 'success' : 'primary'} minimal>
          {RESTORATION_STATUS_LABEL[r.status].toLowerCase()}
        </Tag>{' '}
        {!current && (
          <Tag minimal icon="history">
            amended
          </Tag>
        )}
      </h2>
      <p>
        {RETENTION_LABEL[r.retention]} · {MATERIAL_LABEL[r.material]}
        {r.shade ? ` · shade ${r.shade}` : ''}
        {r.deliveredOn ? ` · delivered ${formatDate(r.deliveredOn)}` : ''} · planned by {r.plannedByName ?? 'unknown'}{' '}
        on {formatDateTime(r.createdAt)}
      </p>
      {!r.retrievable && (
        <Callout intent="warning" icon="warning-sign" compact>
          Cement-retained: not retrievable without cutting.
        </Callout>
      )}
      {r.amendmentReason && <p>Amendment: {r.amendmentReason}</p>}
      <ul>
        {r.sites.map((s) => (
          <li key={s.siteId}>
            <Link to={`/patients/${patientId}/sites/${s.siteId}`}>Site {formatTooth(s.fdi, system)}</Link>:{' '}
            {INTERFACE_LABEL[s.interface].toLowerCase()} interface,{' '}
            {IMPRESSION_COPING_LABEL[s.impressionCoping].toLowerCase()}
            {s.components.length > 0 && ` — ${s.components.map((c) => c.name).join(', ')}`}
          </li>
        ))}
      </ul>
      {r.findings.length > 0 && (
        <div>
          <strong>Findings when saved (rules {r.rulesVersion}):</strong>
          <ul>
            {r.findings.map((f) => (
              <li key={`${f.code}:${f.fdi ?? ''}`}>
                {FINDING_SEVERITY_LABEL[f.severity].toLowerCase()}: {f.message}{' '}
                {r.acknowledgements?.find((a) => a.code === f.code) && (
                  <em>(acknowledged by {r.acknowledgements.find((a) => a.code === f.code)!.byName})</em>
                )}
              </li>
            ))}
          </ul>
        </div>
      )}
      {(r.labPrescriptions?.length ?? 0) > 0 && (
        <ul aria-label="Lab prescriptions">
          <Can I="read" a="Impression">
            <ImpressionSummary restorationId={r.id} system={system} />
          </Can>
          {(r.labPrescriptions ?? []).map((l) => (
            <li key={l.id}>
              <a href={`/api/lab-prescriptions/${l.id}/pdf`} data-testid="lab-pdf-link">
                Lab prescription no. {l.number} of {formatDateTime(l.createdAt)}
              </a>
              {l.emailedTo && ` · e-mailed to ${l.emailedTo}`}
              {l.lastEmail && l.lastEmail.status !== 'sent' && (
                <span data-testid="lab-mail-status">
                  {` · e-mail to ${l.lastEmail.to}: ${REMINDER_STATUS_LABEL[l.lastEmail.status].toLowerCase()}`}
                  {l.lastEmail.status === 'pending' && ' (sent as soon as the mail server answers)'}
                </span>
              )}
            </li>
          ))}
        </ul>
      )}
      {current && (
        <Can I="read" a="Impression">
          <ImpressionPanel restorationId={r.id} sites={r.sites} system={system} retention={r.retention} />
        </Can>
      )}
      {current && (
        <Can I="create" a="Restoration">
          <div className="planner__actions">
            <Button
              icon="document"
              text="Lab prescription (PDF)"
              // Opens the plan version's prescription (the existing one when there is one: pressing
              // again makes no second); only "Revise prescription" makes a new version.
              onClick={() =>
                runMutation(
                  lab,
                  { emailToLab: false },
                  { onSuccess: (made) => downloadPdf(`/api/lab-prescriptions/${made.id}/pdf`) },
                )
              }
              loading={lab.isPending && !lab.variables.emailToLab && !lab.variables.revise}
              data-testid="make-lab-pdf"
            />
            {(r.labPrescriptions?.length ?? 0) > 0 && (
              <Button
                icon="refresh"
                text="Revise prescription"
                onClick={() => lab.mutate({ emailToLab: false, revise: true })}
                loading={lab.isPending && lab.variables.revise === true}
                data-testid="revise-lab-pdf"
              />
            )}
            {r.labEmail && (
              <Button
                icon="envelope"
                text={`E-mail to ${r.labEmail}`}
                onClick={() => lab.mutate({ emailToLab: true })}
                loading={lab.isPending && lab.variables.emailToLab === true}
              />
            )}
            {r.status === 'planned' && (
              <Link className={Classes.BUTTON} to={`/patients/${patientId}/restorations/new?amend=${r.id}`}>
                Amend plan
              </Link>
            )}
            {r.status === 'planned' && (
              <Button
                intent="primary"
                icon="endorsed"
                text="Deliver"
                onClick={() => setDelivering((v) => !v)}
                data-testid="deliver-button"
              />
            )}
          </div>
          {lab.isError && (
            <Callout intent="danger" role="alert" compact>
              {lab.error.message}
            </Callout>
          )}
          {delivering && r.status === 'planned' && (
            <DeliveryForm
              restoration={r}
              onDone={(delivered) => {
                setDelivering(false);
                setSeating(delivered);
              }}
            />
          )}
        </Can>
      )}
      {current && r.status === 'delivered' && (
        <Can I="create" a="TorqueEvent">
          {!seating && (
            <Button
              icon="wrench"
              text="Seat restoration"
              onClick={() => setSeating(true)}
              data-testid="seat-restoration-button"
            />
          )}
          {seating && <SeatRestorationForm restorationId={r.id} onDone={() => setSeating(false)} />}
        </Can>
      )}
      {r.status === 'delivered' && r.sites[0] && (
        <AnchorButton
          minimal
          icon="layers"
          href={`/patients/${patientId}/sites/${r.sites[0].siteId}`}
          text="Open the Site file"
        />
      )}
    </Card>
  );
}
