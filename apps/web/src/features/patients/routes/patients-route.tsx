import '../components/patients.css';
import { Classes, NonIdealState, Switch } from '@blueprintjs/core';
import { useCallback } from 'react';
import { Link, useLocation, useNavigation, useSearchParams } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { ErrorState } from '../../../lib/components/error-state';
import { LiveSearch } from '../../../lib/components/live-search';
import { LoadingState } from '../../../lib/components/loading-state';
import { usePatientList } from '../api/list-patients';
import { PatientsTable } from '../components/patients-table';

/** /patients?search=…: the search lives in the URL, so it survives reload and Back. */
export function PatientsRoute() {
  const [params, setParams] = useSearchParams();
  const search = params.get('search')?.trim() ?? '';
  // "Show archived" lists current and archived patients together; archived rows say so.
  const showArchived = params.get('archived') === 'all';
  const patients = usePatientList(search, showArchived ? 'all' : 'active');

  // A search that settles (debounced) while a patient's page is loading must not replace that
  // navigation and pull the user back to the list.
  const { pathname } = useLocation();
  const pending = useNavigation().location;
  const leaving = pending !== undefined && pending.pathname !== pathname;

  const onSearch = useCallback(
    (next: string) => {
      if (next === search || leaving) return;
      setParams(
        (current) => {
          const updated = new URLSearchParams(current);
          if (next) updated.set('search', next);
          else updated.delete('search');
          return updated;
        },
        { replace: true },
      );
    },
    [search, setParams, leaving],
  );
  const toggleArchived = () =>
    setParams(
      (current) => {
        const updated = new URLSearchParams(current);
        if (showArchived) updated.delete('archived');
        else updated.set('archived', 'all');
        return updated;
      },
      { replace: true },
    );

  return (
    <div className="patients-page">
      <title>Patients · Torquetrail</title>
      <h1 className="page-title">Patients</h1>
      <div className="patients-toolbar">
        <LiveSearch
          id="patient-search"
          label="Search patients"
          helperText="Name or chart number"
          placeholder="e.g. Novak or C-1042"
          value={search}
          onSearch={onSearch}
          busy={patients.isFetching && !patients.isPending}
        />
        <Switch
          label="Show archived"
          checked={showArchived}
          onChange={toggleArchived}
          data-testid="show-archived"
          className="bp6-align-left"
        />
        <Can I="create" a="Patient">
          <Link className={`${Classes.BUTTON} ${Classes.INTENT_PRIMARY}`} to="/patients/new" data-testid="new-patient">
            New patient
          </Link>
        </Can>
      </div>
      {patients.isPending ? (
        <LoadingState label="Loading patients" />
      ) : patients.isError ? (
        <ErrorState title="Could not load patients" error={patients.error} onRetry={() => void patients.refetch()} />
      ) : patients.data.items.length === 0 ? (
        <NonIdealState
          icon="search"
          title={search ? `No patients match “${search}”` : 'No patients yet'}
          description={
            search
              ? 'Check the spelling, or search by chart number.'
              : 'Patients of your practice, and patients shared with you, appear here.'
          }
        />
      ) : (
        <div aria-busy={patients.isFetching}>
          <p className="result-count" aria-live="polite">
            {patients.data.items.length} {patients.data.items.length === 1 ? 'patient' : 'patients'}
            {search ? ` matching “${search}”` : ''}
          </p>
          <PatientsTable patients={patients.data.items} />
        </div>
      )}
    </div>
  );
}
