import '../components/catalogue.css';
import { Button, Callout, HTMLTable, InputGroup } from '@blueprintjs/core';
import { useState } from 'react';
import { Can, useAppAbility } from '../../../lib/ability';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { useRecordCalibration, useWrenches } from '../../torque';
import { useCatalogue } from '../api/catalogue-api';
import { SystemGtins } from '../components/system-gtins';
import { ComponentRow } from '../components/component-row';
import { AddComponentForm, AddPlatformForm, AddSystemForm, AddWrenchForm } from '../components/add-forms';
import { CONNECTION_LABEL, WRENCH_TYPE_LABEL } from '../../../lib/clinical-labels';

function Wrenches() {
  const wrenches = useWrenches(useAppAbility().can('read', 'Wrench'));
  const save = useRecordCalibration();
  const [dates, setDates] = useState<Record<string, string>>({});
  if (wrenches.isError || !wrenches.data) return null;
  return (
    <section aria-labelledby="wrenches-heading">
      <h2 id="wrenches-heading">Torque wrenches</h2>
      <p className="muted">
        Spring-style devices deviate far less than friction-style ones, which drift with age (Vallee et al. 2008): keep
        calibration dates current. Each calibration is added to the wrench's history; none is overwritten.
      </p>
      <HTMLTable compact striped>
        <thead>
          <tr>
            <th>Wrench</th>
            <th>Type</th>
            <th>Last calibration</th>
          </tr>
        </thead>
        <tbody>
          {wrenches.data.items.map((w) => (
            <tr key={w.id}>
              <td>{w.label}</td>
              <td>{WRENCH_TYPE_LABEL[w.type].toLowerCase()}</td>
              <td>
                {w.lastCalibratedOn ?? 'not recorded'}
                <Can I="update" a="Wrench">
                  {' '}
                  <InputGroup
                    type="date"
                    aria-label={`New calibration date of ${w.label}`}
                    value={dates[w.id] ?? ''}
                    onValueChange={(v) => setDates({ ...dates, [w.id]: v })}
                    style={{ width: '11em', display: 'inline-block' }}
                  />
                  <Button
                    small
                    text="Record calibration"
                    disabled={!dates[w.id]}
                    loading={save.isPending}
                    onClick={() => save.mutate({ id: w.id, body: { calibratedOn: dates[w.id] } })}
                  />
                </Can>
              </td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
      <Can I="create" a="Wrench">
        <AddWrenchForm />
      </Can>
    </section>
  );
}

/** /catalogue: the practice's implant systems, platforms and parts with their torque specifications. */
export function CatalogueRoute() {
  const catalogue = useCatalogue();
  if (catalogue.isPending) return <LoadingState label="Loading the catalogue" />;
  if (catalogue.isError)
    return (
      <ErrorState
        title="Could not load the catalogue"
        error={catalogue.error}
        onRetry={() => void catalogue.refetch()}
      />
    );
  return (
    <div className="catalogue-page">
      <title>Component catalogue · Torquetrail</title>
      <h1>Component catalogue</h1>
      <Callout intent="warning" icon="info-sign" data-testid="catalogue-caution">
        {catalogue.data.caution} The values here are what the practice entered.
      </Callout>
      {catalogue.data.systems.length === 0 && <p>This practice has no catalogue yet.</p>}
      <Can I="create" a="Catalogue">
        <AddSystemForm />
      </Can>
      {catalogue.data.systems.map((s) => (
        <section key={s.id} aria-label={s.name}>
          <h2>
            {s.name} <span className="muted">({s.manufacturer})</span>
          </h2>
          <SystemGtins system={s} />
          {s.platforms.map((p) => (
            <div key={p.id}>
              <h3>
                {p.name}: {p.diameterMm} mm, {CONNECTION_LABEL[p.connection].toLowerCase()}, platform shift{' '}
                {p.platformShift ? 'yes' : 'no'}
              </h3>
              <HTMLTable compact striped className="catalogue-table">
                <thead>
                  <tr>
                    <th>Part</th>
                    <th>Reference</th>
                    <th>Kind</th>
                    <th>Features</th>
                    <th>Torque</th>
                    <th>Tolerance</th>
                    <th>Records</th>
                    <Can I="update" a="Catalogue">
                      <th>Edit</th>
                    </Can>
                  </tr>
                </thead>
                <tbody>
                  {p.components.map((c) => (
                    <ComponentRow key={c.id} part={c} />
                  ))}
                </tbody>
              </HTMLTable>
              <Can I="create" a="Catalogue">
                <AddComponentForm platformId={p.id} />
              </Can>
            </div>
          ))}
          <Can I="create" a="Catalogue">
            <AddPlatformForm systemId={s.id} />
          </Can>
        </section>
      ))}
      <Wrenches />
    </div>
  );
}
