import { HTMLTable, Tag } from '@blueprintjs/core';
import { seatingMissingPhrase } from './cell-description';
import type { ArchSite } from '@torquetrail/contracts';
import { formatTooth, TOOTH_POSITIONS_PERMANENT, TOOTH_POSITIONS_PRIMARY } from '@torquetrail/domain';
import { Link } from 'react-router-dom';
import { formatDate } from '../../../lib/dates';
import { SITE_STATUS_LABEL } from '../../../lib/labels';
import { MaintenanceStatusLabel } from '../../../lib/maintenance-status';
import type { ToothSystem } from '../../../lib/tooth-system';

const CHART_ORDER = [...TOOTH_POSITIONS_PERMANENT, ...TOOTH_POSITIONS_PRIMARY];

interface SitesTableProps {
  patientId: string;
  sites: readonly ArchSite[];
  system: ToothSystem;
}

/** Every implant site in charting order, each linked to its Site file. */
export function SitesTable({ patientId, sites, system }: SitesTableProps) {
  const ordered = [...sites].sort((a, b) => CHART_ORDER.indexOf(a.fdi) - CHART_ORDER.indexOf(b.fdi));
  return (
    <div className="table-scroll">
      <HTMLTable striped compact className="sites-table">
        <caption className="visually-hidden">Implant sites</caption>
        <thead>
          <tr>
            <th scope="col">Site</th>
            <th scope="col">Status</th>
            <th scope="col">Maintenance status</th>
            <th scope="col">Last exam</th>
            <th scope="col">System</th>
            <th scope="col">Seating torque</th>
          </tr>
        </thead>
        <tbody>
          {ordered.map((site) => (
            <tr key={site.id}>
              <th scope="row">
                <Link to={`/patients/${patientId}/sites/${site.id}`}>Site {formatTooth(site.fdi, system)}</Link>
              </th>
              <td>
                <Tag minimal intent={site.status === 'failed' ? 'danger' : 'none'}>
                  {SITE_STATUS_LABEL[site.status]}
                </Tag>
              </td>
              <td>
                <MaintenanceStatusLabel status={site.maintenanceStatus} />
              </td>
              <td>{site.lastExamDate ? formatDate(site.lastExamDate) : '—'}</td>
              <td>{site.systemName ?? '—'}</td>
              <td data-testid="site-seating-torque">
                {site.partsMissingSeatingTorque ? (
                  <Tag minimal intent="warning" icon="warning-sign">
                    {seatingMissingPhrase(site.partsMissingSeatingTorque)}
                  </Tag>
                ) : site.partsMissingSeatingTorque === 0 ? (
                  'Logged'
                ) : (
                  '—'
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
    </div>
  );
}
