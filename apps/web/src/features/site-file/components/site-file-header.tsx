import { Tag } from '@blueprintjs/core';
import type { SiteFile } from '@torquetrail/contracts';
import { fdiToUniversal, formatTooth } from '@torquetrail/domain';
import { formatDate } from '../../../lib/dates';
import { MAINTENANCE_NOTE, SITE_STATUS_LABEL } from '../../../lib/labels';
import { MaintenanceStatusLabel } from '../../../lib/maintenance-status';
import type { ToothSystem } from '../../../lib/tooth-system';
import { FactList } from './fact-list';
import { CONNECTION_LABEL, formatNumber, LOADING_PROTOCOL_LABEL } from '../../../lib/clinical-labels';

/** Which implant this is: position, status, and the implant body as placed. */
export function SiteFileHeader({ site, system }: { site: SiteFile; system: ToothSystem }) {
  const placement = site.placement;
  return (
    <header className="site-file-header" data-testid="site-file-header">
      <div className="site-file-header__title">
        <h1 className="page-title">Site {formatTooth(site.fdi, system)}</h1>
        <span className="site-file-header__positions">
          FDI {site.fdi} · Universal {fdiToUniversal(site.fdi)}
        </span>
        <Tag minimal large intent={site.status === 'failed' ? 'danger' : 'none'}>
          {SITE_STATUS_LABEL[site.status]}
        </Tag>
      </div>
      <p className="site-file-header__patient muted">{site.patientName}</p>
      <div className="site-file-header__maintenance">
        <span>
          Maintenance status: <MaintenanceStatusLabel status={site.maintenanceStatus} />
        </span>
        <p className="maintenance-note">{MAINTENANCE_NOTE}</p>
      </div>
      {placement ? (
        <FactList
          facts={[
            ['Implant system', placement.systemName],
            ['Manufacturer', placement.manufacturer],
            ['Diameter × length', `${formatNumber(placement.diameterMm)} × ${formatNumber(placement.lengthMm)} mm`],
            ['Platform', placement.platformName],
            ['Connection', CONNECTION_LABEL[placement.connection]],
            ['Platform shift', placement.platformShift ? 'Yes' : 'No'],
            ['Placed', `${formatDate(placement.placedOn)} by ${placement.surgeonName}`],
            [
              'Insertion torque',
              placement.insertionTorqueNcm === null
                ? 'Not recorded'
                : `${formatNumber(placement.insertionTorqueNcm)} N·cm`,
            ],
            [
              'Stability',
              placement.stabilityIsq === null ? 'Not recorded' : `ISQ ${formatNumber(placement.stabilityIsq)}`,
            ],
            ['Loading', placement.loadingProtocol ? LOADING_PROTOCOL_LABEL[placement.loadingProtocol] : 'Not recorded'],
            ['Lot', placement.lot ? <span className="mono">{placement.lot}</span> : 'Not recorded'],
            [
              'GTIN',
              placement.gtin ? (
                <GtinFact gtin={placement.gtin} otherSystem={placement.gtinOtherSystem} />
              ) : (
                'Not recorded'
              ),
            ],
            ['Serial', placement.serial ? <span className="mono">{placement.serial}</span> : 'Not recorded'],
            ['Expiry', placement.expiry ? formatDate(placement.expiry) : 'Not recorded'],
            ['Grafting', placement.grafting ?? 'None recorded'],
            ['Surgeon’s notes', placement.notes ?? 'None'],
          ]}
        />
      ) : (
        <p className="muted">Not yet placed: the implant body is recorded at placement.</p>
      )}
    </header>
  );
}

/** The GTIN of the implant's label, flagged when the catalogue knows it for another system. */
function GtinFact({ gtin, otherSystem }: { gtin: string; otherSystem: string | null }) {
  return (
    <>
      <span className="mono">{gtin}</span>
      {otherSystem && (
        <Tag minimal intent="warning" icon="warning-sign" className="site-file-header__flag" data-testid="gtin-flag">
          The catalogue knows this GTIN as {otherSystem}, not the system chosen: check the label and the system
        </Tag>
      )}
    </>
  );
}
