import { Callout, Card, Tag } from '@blueprintjs/core';
import { type ComponentKind, DENTURE_RETAINER_KINDS, type StackPart } from '@torquetrail/contracts';
import { type ReactNode, useState } from 'react';
import { formatDate, formatDateTime } from '../../../lib/dates';
import { FactList } from './fact-list';
import { RETIGHTEN_AFTER_MINUTES } from '@torquetrail/domain';
import {
  ANGLED_KINDS,
  COMPONENT_KIND_LABEL,
  formatNumber,
  formatTorqueSpec,
  INTERFACE_LABEL,
  TORQUE_REASON_LABEL,
} from '../../../lib/clinical-labels';
import { TorqueVerdictTag } from './torque-verdict-tag';

/** One part of the Stack: what it is, its specification, and the last torque applied to it. */
export function StackPartCard({ part }: { part: StackPart }) {
  const facts: [string, ReactNode][] = [
    [
      'Reference',
      <span key="reference" className="mono">
        {part.referenceCode}
      </span>,
    ],
  ];
  if (part.engaging !== null) facts.push(['Interface', INTERFACE_LABEL[part.engaging ? 'engaging' : 'non-engaging']]);
  if (part.angleDeg !== null) facts.push(['Angle', `${formatNumber(part.angleDeg)}°`]);
  else if (ANGLED_KINDS.includes(part.kind)) facts.push(['Angle', 'Straight']);
  // An insert or a clip sits in the denture's housing by its retention: no torque is ever applied to it.
  const torqueApplies = !(DENTURE_RETAINER_KINDS as readonly ComponentKind[]).includes(part.kind);
  facts.push([
    'Torque specification',
    torqueApplies ? formatTorqueSpec(part.torqueSpecNcm, part.tolerancePct) : 'Does not apply',
  ]);
  // The part is shown as installed; new torque entries use the catalogue's current version.
  if (part.newerVersion && torqueApplies)
    facts.push([
      'Catalogue updated since',
      `${formatTorqueSpec(part.newerVersion.torqueSpecNcm, part.newerVersion.tolerancePct)} now${
        part.newerVersion.name !== part.name ? ` (${part.newerVersion.name})` : ''
      }`,
    ]);
  facts.push([
    'Lot',
    part.lot ? (
      <span key="lot" className="mono">
        {part.lot}
      </span>
    ) : (
      'Not recorded'
    ),
  ]);
  facts.push(['Installed', formatDate(part.installedOn)]);

  const last = part.lastTorque;
  // The time the card was first shown: "due now" or "due at" (the Site file refetches after each entry).
  const [shownAt] = useState(() => Date.now());
  return (
    <Card
      className="stack-card"
      data-testid="stack-part"
      data-seating-missing={part.seatingTorqueMissing || undefined}
      compact
    >
      <h3 className="stack-card__title">
        <span className="stack-card__kind">{COMPONENT_KIND_LABEL[part.kind]}</span>
        <span>{part.name}</span>
      </h3>
      <FactList facts={facts} />
      {part.seatingTorqueMissing && (
        <Callout
          intent="warning"
          icon="warning-sign"
          compact
          className="stack-card__retorque"
          data-testid="seating-torque-missing"
        >
          Seating torque missing: no initial seating torque was ever logged on this part, so nothing shows it was
          tightened to its specification. Log it (Log torque, or Seat restoration for every screw at once).
        </Callout>
      )}
      {part.retorqueDueAt && (
        <Callout intent="warning" icon="time" compact className="stack-card__retorque" data-testid="retorque-due">
          Re-torque due {new Date(part.retorqueDueAt).getTime() <= shownAt ? 'now' : 'at'}{' '}
          {formatDateTime(part.retorqueDueAt)}: about {RETIGHTEN_AFTER_MINUTES} minutes after the initial seating, to
          offset settling (Siamos et al. 2002). Log a re-torque to clear this reminder.
        </Callout>
      )}
      {torqueApplies ? (
        <div className="stack-card__torque">
          <span className="stack-card__torque-label">Last applied torque</span>
          {last ? (
            <>
              <span>
                {formatNumber(last.appliedNcm)} N·cm on {formatDateTime(last.performedAt)} ·{' '}
                {TORQUE_REASON_LABEL[last.reason]}
                {last.specNcm !== part.torqueSpecNcm && (
                  <span className="muted"> (against {formatTorqueSpec(last.specNcm, last.tolerancePct)})</span>
                )}
              </span>
              <TorqueVerdictTag verdict={last.verdict} />
              {last.wrenchCalibrationOverdue && (
                <Tag intent="warning" minimal icon="warning-sign" data-testid="calibration-overdue-flag">
                  wrench calibration overdue
                </Tag>
              )}
            </>
          ) : (
            <span className="muted">None recorded</span>
          )}
        </div>
      ) : (
        <p className="stack-card__torque muted" data-testid="torque-not-applicable">
          Torque does not apply to a {COMPONENT_KIND_LABEL[part.kind].toLowerCase()}: it is held in the denture by its
          retention. Its changes are logged as insert changes.
        </p>
      )}
    </Card>
  );
}
