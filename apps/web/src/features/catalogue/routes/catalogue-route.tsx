import '../components/catalogue.css';
import { Button, Callout, FormGroup, HTMLTable, InputGroup, Tag } from '@blueprintjs/core';
import { isApiError } from '../../../lib/api-client';
import { WrenchSettingsForm } from '../components/wrench-settings-form';
import { ImpressionSettingsSwitch } from '../../impressions';
import { CantileverSettingsForm } from '../components/cantilever-settings-form';
import { useState } from 'react';
import { Can, useAppAbility } from '../../../lib/ability';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { useRecordCalibration, useWrenches } from '../../torque';
import { useCatalogue } from '../api/catalogue-api';
import { SystemGtins } from '../components/system-gtins';
import { ComponentRow } from '../components/component-row';
import { filterCatalogue } from '../components/catalogue-filter';
import { AddComponentForm, AddPlatformForm, AddSystemForm, AddWrenchForm } from '../components/add-forms';
import { CONNECTION_LABEL, WRENCH_TYPE_LABEL } from '../../../lib/clinical-labels';
import { DateInput } from '../../../lib/components/date-input';
import { formatDate } from '../../../lib/dates';

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
            <th>Calibration due</th>
          </tr>
        </thead>
        <tbody>
          {wrenches.data.items.map((w) => (
            <tr key={w.id}>
              <td>{w.label}</td>
              <td>{WRENCH_TYPE_LABEL[w.type].toLowerCase()}</td>
              <td>
                {w.lastCalibratedOn ? formatDate(w.lastCalibratedOn) : 'not recorded'}
                <Can I="update" a="Wrench">
                  {' '}
                  <DateInput
                    aria-label={`New calibration date of ${w.label}`}
                    value={dates[w.id] ?? ''}
                    onChange={(v) => setDates({ ...dates, [w.id]: v })}
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
              <td data-testid="wrench-due">
                {w.calibrationDueOn ? formatDate(w.calibrationDueOn) : '—'}{' '}
                {w.calibrationOverdue && (
                  <Tag intent="warning" minimal icon="warning-sign">
                    overdue
                  </Tag>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
      {save.isError && (
        <Callout intent="danger" role="alert" compact data-testid="calibration-error">
          {/* The date's own sentence (e.g. a date in the future), else the reply's message. */}
          {(isApiError(save.error) && save.error.fields.calibratedOn) || save.error.message}
        </Callout>
      )}
      <Can I="update" a="Practice">
        <WrenchSettingsForm months={wrenches.data.calibrationIntervalMonths} />
        <ImpressionSettingsSwitch />
      </Can>
      <Can I="create" a="Wrench">
        <AddWrenchForm />
      </Can>
      <Can I="update" a="Practice">
        <CantileverSettingsForm />
      </Can>
    </section>
  );
}

const plural = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 's'}`;

/**
 * /catalogue: the practice's implant systems, platforms and parts with their torque specifications,
 * grouped by system and platform, narrowed by a search as the user types (catalogue-filter.ts).
 */
export function CatalogueRoute() {
  const catalogue = useCatalogue();
  const [search, setSearch] = useState('');
  if (catalogue.isPending) return <LoadingState label="Loading the catalogue" />;
  if (catalogue.isError)
    return (
      <ErrorState
        title="Could not load the catalogue"
        error={catalogue.error}
        onRetry={() => void catalogue.refetch()}
      />
    );
  const shown = filterCatalogue(catalogue.data.systems, search);
  const searching = search.trim() !== '';
  return (
    <div className="catalogue-page">
      <title>Component catalogue · Torquetrail</title>
      <h1>Component catalogue</h1>
      <Callout intent="warning" icon="info-sign" data-testid="catalogue-caution" id="catalogue-caution">
        {catalogue.data.caution} The values here are what the practice entered.
      </Callout>
      {catalogue.data.systems.length === 0 && <p>This practice has no catalogue yet.</p>}
      {catalogue.data.systems.length > 0 && (
        <div role="search" className="catalogue-search">
          <FormGroup
            label="Search the catalogue"
            labelFor="catalogue-search"
            helperText="System, manufacturer, platform, part name, reference or kind; every word must match."
          >
            <InputGroup
              id="catalogue-search"
              data-testid="catalogue-search"
              type="search"
              leftIcon="search"
              value={search}
              onValueChange={setSearch}
              autoComplete="off"
            />
          </FormGroup>
          <p className="muted" aria-live="polite" data-testid="catalogue-count">
            {searching
              ? `${plural(shown.parts, 'part')} in ${plural(shown.systems.length, 'system')} match “${search.trim()}”.`
              : `${plural(shown.parts, 'part')} in ${plural(shown.systems.length, 'system')}.`}
          </p>
        </div>
      )}
      {searching && shown.systems.length === 0 && (
        <Callout intent="primary" data-testid="catalogue-no-match">
          Nothing in the catalogue matches “{search.trim()}”. Try fewer words, or a reference code.
        </Callout>
      )}
      <Can I="create" a="Catalogue">
        <AddSystemForm />
      </Can>
      {shown.systems.map((s) => (
        <section key={s.id} aria-label={s.name} className="catalogue-system" data-testid="catalogue-system">
          <h2>
            {s.name} <span className="muted">({s.manufacturer})</span>{' '}
            <span className="catalogue-count">
              {plural(s.platforms.length, 'platform')},{' '}
              {plural(
                s.platforms.reduce((n, p) => n + p.components.length, 0),
                'part',
              )}
            </span>
          </h2>
          <SystemGtins system={s} />
          {s.platforms.map((p) => (
            <div key={p.id} className="catalogue-platform" data-testid="catalogue-platform">
              <h3>
                {p.name}: {p.diameterMm} mm, {CONNECTION_LABEL[p.connection].toLowerCase()}, platform shift{' '}
                {p.platformShift ? 'yes' : 'no'}{' '}
                <span className="catalogue-count">{plural(p.components.length, 'part')}</span>
              </h3>
              {p.components.length > 0 && (
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
              )}
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
