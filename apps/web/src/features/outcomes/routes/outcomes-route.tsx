import '../components/outcomes.css';
import { Callout, HTMLSelect, HTMLTable, NonIdealState } from '@blueprintjs/core';
import { OUTCOME_GROUPINGS, type OutcomeGrouping, type SurvivalCurve } from '@torquetrail/contracts';
import { Link, useSearchParams } from 'react-router-dom';
import { RETENTION_LABEL } from '../../../lib/clinical-labels';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { PageSwitcher } from '../../../lib/components/page-switcher';
import { formatDate } from '../../../lib/dates';
import { IMPLANT_OUTCOME_LABEL, MAINTENANCE_STATUS_LABEL, OUTCOME_GROUPING_LABEL } from '../../../lib/labels';
import { OUTCOMES_PAGE_SIZE, useOutcomes } from '../api/outcomes-api';
import { SurvivalChart } from '../components/survival-chart';
import { ChartNumber } from '../../../lib/components/chart-number';

const curveName = (c: SurvivalCurve, groupBy: OutcomeGrouping) =>
  c.group === null
    ? 'Not restored yet'
    : groupBy === 'retention'
      ? (RETENTION_LABEL[c.group as keyof typeof RETENTION_LABEL] ?? c.group)
      : c.group;

/** /outcomes: how the implants do — a practice audit of survival and complications. */
export function OutcomesRoute() {
  const [url, setUrl] = useSearchParams();
  const groupBy: OutcomeGrouping = url.get('groupBy') === 'retention' ? 'retention' : 'system';
  const page = Math.max(1, Number(url.get('page') ?? 1) || 1);
  const report = useOutcomes(groupBy, page);
  const goToPage = (next: number) =>
    setUrl(
      (current) => {
        const params = new URLSearchParams(current);
        params.set('page', String(next));
        return params;
      },
      { replace: true },
    );
  return (
    <div className="outcomes-page">
      <title>How the implants do · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'How the implants do' }]} />
      <h1 className="page-title">How the implants do</h1>
      <Callout intent="primary" className="outcomes-page__note" data-testid="audit-note">
        A practice audit of the implants recorded here, not evidence for choosing one treatment over another: the groups
        are small, not randomised, and differ in patients and follow-up. An implant counts as surviving while it is in
        the mouth, whatever its condition; it is censored at today&apos;s date.
      </Callout>
      <label htmlFor="outcomes-group">
        Curves by{' '}
        <HTMLSelect
          id="outcomes-group"
          value={groupBy}
          onChange={(e) => setUrl({ groupBy: e.currentTarget.value }, { replace: true })}
        >
          {OUTCOME_GROUPINGS.map((g) => (
            <option key={g} value={g}>
              {OUTCOME_GROUPING_LABEL[g]}
            </option>
          ))}
        </HTMLSelect>
      </label>
      {report.isPending ? (
        <LoadingState label="Loading the implants" />
      ) : report.isError ? (
        <ErrorState
          title="The outcomes could not be loaded"
          error={report.error}
          onRetry={() => void report.refetch()}
        />
      ) : report.data.total === 0 ? (
        <NonIdealState icon="timeline-line-chart" title="No implant placed yet" />
      ) : (
        <>
          <h2>Implant survival (Kaplan–Meier)</h2>
          <SurvivalChart curves={report.data.curves} name={(c) => curveName(c, groupBy)} />
          {report.data.withoutEndDate > 0 && (
            <p>
              {report.data.withoutEndDate} failed or removed implant(s) have no end date and are left out of the curves.
            </p>
          )}
          <h2>Prosthetic complications</h2>
          <p data-testid="complication-rate">
            {report.data.complications.events} complication(s) over {report.data.complications.implantYears.toFixed(1)}{' '}
            implant-years
            {report.data.complications.per100ImplantYears !== null
              ? `: ${report.data.complications.per100ImplantYears.toFixed(2)} per 100 implant-years`
              : ''}
            .
          </p>
          <h2 id="outcomes-implants-heading">Implants</h2>
          <p className="outcomes-page__count" data-testid="outcomes-count" aria-live="polite">
            {report.isPlaceholderData
              ? `Loading page ${page}…`
              : report.data.implants.length === 0
                ? `No implants on this page; ${report.data.total} in all.`
                : `Implants ${(page - 1) * OUTCOMES_PAGE_SIZE + 1}–${(page - 1) * OUTCOMES_PAGE_SIZE + report.data.implants.length} of ${report.data.total}, oldest placement first.`}
          </p>
          <HTMLTable
            className="outcomes-table"
            striped
            compact
            data-testid="outcomes-table"
            aria-labelledby="outcomes-implants-heading"
          >
            <thead>
              <tr>
                <th scope="col">Patient</th>
                <th scope="col">Site</th>
                <th scope="col">Placed</th>
                <th scope="col">System</th>
                <th scope="col">Status</th>
                <th scope="col">Latest peri-implant status</th>
                <th scope="col">Bone change since loading</th>
              </tr>
            </thead>
            <tbody>
              {report.data.implants.map((i) => (
                <tr key={i.siteId}>
                  <td>
                    <Link to={`/patients/${i.patientId}`}>
                      <ChartNumber value={i.chartNumber} />
                    </Link>
                  </td>
                  <td>
                    <Link to={`/patients/${i.patientId}/sites/${i.siteId}`}>{i.fdi}</Link>
                  </td>
                  <td>{formatDate(i.placedOn)}</td>
                  <td>{i.system}</td>
                  <td>
                    {IMPLANT_OUTCOME_LABEL[i.outcome]}
                    {i.endedOn ? ` ${formatDate(i.endedOn)}` : ''}
                  </td>
                  <td>
                    {i.periImplantStatus
                      ? `${MAINTENANCE_STATUS_LABEL[i.periImplantStatus]} (${formatDate(i.periImplantOn!)})`
                      : '—'}
                  </td>
                  <td>
                    {i.boneChangeMm === null
                      ? '—'
                      : i.boneChangeMm === 0
                        ? `no change since ${formatDate(i.boneChangeSince!)}`
                        : `${i.boneChangeMm > 0 ? 'loss' : 'gain'} ${Math.abs(i.boneChangeMm).toFixed(1)} mm since ${formatDate(i.boneChangeSince!)}`}
                  </td>
                </tr>
              ))}
            </tbody>
          </HTMLTable>
          {(report.data.total > OUTCOMES_PAGE_SIZE || page > 1) && (
            <PageSwitcher
              page={page}
              pageSize={OUTCOMES_PAGE_SIZE}
              total={report.data.total}
              label="Pages of implants"
              onGo={goToPage}
            />
          )}
        </>
      )}
    </div>
  );
}
