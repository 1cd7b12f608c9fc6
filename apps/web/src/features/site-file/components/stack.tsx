import { Callout, Card, NonIdealState } from '@blueprintjs/core';
import type { SiteFile } from '@torquetrail/contracts';
import type { ToothSystem } from '../../../lib/tooth-system';
import { FactList } from './fact-list';
import { CONNECTION_LABEL, formatNumber } from '../../../lib/clinical-labels';
import { LogTorquePanel } from '../../torque';
import { RestorationCard } from './restoration-card';
import { StackPartCard } from './stack-part-card';

/** The Stack: what is physically there, from the implant outward to the restoration. */
export function Stack({ site, system }: { site: SiteFile; system: ToothSystem }) {
  const empty = site.parts.length === 0 && !site.restoration;
  return (
    <section className="stack" aria-labelledby="stack-heading">
      <div className="section-heading">
        <h2 id="stack-heading">Stack</h2>
        <LogTorquePanel siteId={site.id} parts={site.parts} />
      </div>
      <Callout intent="warning" icon="info-sign" className="stack__caution" compact>
        Torque values and compatibility are manufacturer-specific: the catalogue holds what the practice entered; the
        manufacturer's instructions, the clinician's judgement and local regulations rule.
      </Callout>
      <ol className="stack__list" aria-label="Stack, from the implant outward">
        {site.placement && (
          <li>
            <Card className="stack-card stack-card--implant" compact>
              <h3 className="stack-card__title">
                <span className="stack-card__kind">Implant</span>
                <span>{site.placement.systemName}</span>
              </h3>
              <FactList
                facts={[
                  ['Platform', site.placement.platformName],
                  ['Connection', CONNECTION_LABEL[site.placement.connection]],
                  ['Size', `${formatNumber(site.placement.diameterMm)} × ${formatNumber(site.placement.lengthMm)} mm`],
                ]}
              />
            </Card>
          </li>
        )}
        {site.parts.map((part) => (
          <li key={part.instanceId}>
            <StackPartCard part={part} />
          </li>
        ))}
        {site.restoration && (
          <li>
            <RestorationCard restoration={site.restoration} system={system} patientId={site.patientId} />
          </li>
        )}
      </ol>
      {empty && (
        <NonIdealState
          icon="layers"
          title="No parts recorded yet"
          description="Abutments, screws and the restoration appear here as they are recorded."
        />
      )}
    </section>
  );
}
