import { Callout, Card, Tag } from '@blueprintjs/core';
import type { SeatingSummary, StackRestoration } from '@torquetrail/contracts';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { formatTooth } from '@torquetrail/domain';
import { formatDate } from '../../../lib/dates';
import type { ToothSystem } from '../../../lib/tooth-system';
import { FactList } from './fact-list';
import {
  INTERFACE_LABEL,
  MATERIAL_LABEL,
  RESTORATION_KIND_LABEL,
  RETENTION_LABEL,
  SEATING_ANSWER_LABEL,
  SEATING_NOT_CHECKED,
} from '../../../lib/clinical-labels';

const SEATING_INTENT = { yes: 'success', no: 'danger', unsure: 'warning' } as const;

/** Whether the delivery's seating was confirmed on a radiograph, with a link to that radiograph. */
function Seating({ seating, patientId }: { seating: SeatingSummary | null; patientId: string }) {
  if (!seating) return <span data-testid="stack-seating">{SEATING_NOT_CHECKED}</span>;
  return (
    <span data-testid="stack-seating">
      <Tag minimal intent={SEATING_INTENT[seating.seated]}>
        {SEATING_ANSWER_LABEL[seating.seated]}
      </Tag>{' '}
      <Link to={`/patients/${patientId}/radiographs/${seating.radiographId}`}>
        radiograph{seating.radiographTakenOn ? ` of ${formatDate(seating.radiographTakenOn)}` : ''}
      </Link>
      {seating.radiographEnteredInError && ' (since marked entered in error: check again)'}
    </span>
  );
}

/** The outermost layer of the Stack: the restoration and how it is held. */
export function RestorationCard({
  restoration,
  system,
  patientId,
}: {
  restoration: StackRestoration;
  system: ToothSystem;
  patientId: string;
}) {
  return (
    <Card className="stack-card stack-card--restoration" data-testid="stack-restoration" compact>
      <h3 className="stack-card__title">
        <span className="stack-card__kind">Restoration</span>
        <span>{RESTORATION_KIND_LABEL[restoration.kind]}</span>
        {restoration.provisional && (
          <Tag intent="warning" minimal data-testid="stack-provisional">
            Provisional
          </Tag>
        )}
      </h3>
      <FactList
        facts={[
          ['Retention', RETENTION_LABEL[restoration.retention]],
          ['Material', MATERIAL_LABEL[restoration.material]],
          ['Interface', INTERFACE_LABEL[restoration.interface]],
          ['Delivered', restoration.deliveredOn ? formatDate(restoration.deliveredOn) : 'Not yet delivered'],
          ...(restoration.provisional
            ? [
                [
                  'Planned replacement',
                  restoration.plannedReplacementOn ? formatDate(restoration.plannedReplacementOn) : 'Not set',
                ] as [string, ReactNode],
              ]
            : []),
          ['Spans', restoration.spansFdi.map((fdi) => formatTooth(fdi, system)).join(', ')],
          ...(restoration.deliveredOn
            ? [
                [
                  'Seating on radiograph',
                  <Seating key="seating" seating={restoration.seating} patientId={patientId} />,
                ] as [string, ReactNode],
              ]
            : []),
        ]}
      />
      {!restoration.retrievable && (
        <Callout intent="warning" icon="warning-sign" compact>
          Cement-retained: not retrievable without cutting
        </Callout>
      )}
    </Card>
  );
}
