import { Callout, Card } from '@blueprintjs/core';
import type { StackRestoration } from '@torquetrail/contracts';
import { formatTooth } from '@torquetrail/domain';
import { formatDate } from '../../../lib/dates';
import type { ToothSystem } from '../../../lib/tooth-system';
import { FactList } from './fact-list';
import { INTERFACE_LABEL, MATERIAL_LABEL, RESTORATION_KIND_LABEL, RETENTION_LABEL } from '../../../lib/clinical-labels';

/** The outermost layer of the Stack: the restoration and how it is held. */
export function RestorationCard({ restoration, system }: { restoration: StackRestoration; system: ToothSystem }) {
  return (
    <Card className="stack-card stack-card--restoration" data-testid="stack-restoration" compact>
      <h3 className="stack-card__title">
        <span className="stack-card__kind">Restoration</span>
        <span>{RESTORATION_KIND_LABEL[restoration.kind]}</span>
      </h3>
      <FactList
        facts={[
          ['Retention', RETENTION_LABEL[restoration.retention]],
          ['Material', MATERIAL_LABEL[restoration.material]],
          ['Interface', INTERFACE_LABEL[restoration.interface]],
          ['Delivered', restoration.deliveredOn ? formatDate(restoration.deliveredOn) : 'Not yet delivered'],
          ['Spans', restoration.spansFdi.map((fdi) => formatTooth(fdi, system)).join(', ')],
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
