import '../components/recalls.css';
import { AnchorButton, Button, FormGroup, HTMLSelect, HTMLTable, NonIdealState, Switch, Tag } from '@blueprintjs/core';
import { DESK_FILTERS, type RecallDeskQuery, type RecallDeskRow } from '@torquetrail/contracts';
import { RECALL_RISK_FACTORS } from '@torquetrail/domain';
import { Link, useSearchParams } from 'react-router-dom';
import { LiveSearch } from '../../../lib/components/live-search';
import { Can } from '../../../lib/ability';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { PageSwitcher } from '../../../lib/components/page-switcher';
import { formatDate } from '../../../lib/dates';
import { RISK_FACTOR_LABEL } from '../../../lib/clinical-labels';
import { DESK_FILTER_LABEL, DESK_SORT_LABEL, MAINTENANCE_NOTE } from '../../../lib/labels';
import { MaintenanceStatusLabel } from '../../../lib/maintenance-status';
import type { DeskParams } from '../api/keys';
import { deskSearch, useRecallDesk } from '../api/recalls-api';
import { ChartNumber } from '../../../lib/components/chart-number';

type Sort = RecallDeskQuery['sort'];
const PAGE_SIZE = 50;

const riskText = (r: RecallDeskRow['riskFactors']) =>
  r ? RECALL_RISK_FACTORS.filter((factor) => r[factor]).map((factor) => RISK_FACTOR_LABEL[factor]) : [];

/** /recalls: the hygienist's work list — next recall, overdue days, last status per implant, risk factors. */
export function RecallDeskRoute() {
  const [url, setUrl] = useSearchParams();
  const params: DeskParams = {
    filter: (DESK_FILTERS as readonly string[]).includes(url.get('filter') ?? '')
      ? (url.get('filter') as DeskParams['filter'])
      : 'all',
    sort: (url.get('sort') as Sort | null) ?? 'dueOn',
    dir: url.get('dir') === 'desc' ? 'desc' : 'asc',
    search: url.get('search') ?? undefined,
    // Archived patients leave the desk (their reminders stop); "Show archived" brings them back in view.
    archived: url.get('archived') === 'all' ? 'all' : undefined,
    page: Math.max(1, Number(url.get('page') ?? 1) || 1),
    pageSize: PAGE_SIZE,
  };
  const desk = useRecallDesk(params);
  const set = (patch: Partial<Record<string, string | undefined>>) => {
    const next = new URLSearchParams(url);
    for (const [k, v] of Object.entries(patch)) {
      if (v === undefined || v === '') next.delete(k);
      else next.set(k, v);
    }
    if (!('page' in patch)) next.delete('page');
    setUrl(next, { replace: true });
  };
  const sortBy = (sort: Sort) => set({ sort, dir: params.sort === sort && params.dir === 'asc' ? 'desc' : 'asc' });
  const header = (sort: Sort) => (
    <th aria-sort={params.sort === sort ? (params.dir === 'asc' ? 'ascending' : 'descending') : 'none'}>
      <Button
        variant="minimal"
        size="small"
        onClick={() => sortBy(sort)}
        endIcon={params.sort === sort ? (params.dir === 'asc' ? 'caret-up' : 'caret-down') : 'double-caret-vertical'}
      >
        {DESK_SORT_LABEL[sort]}
      </Button>
    </th>
  );

  return (
    <div className="recall-desk">
      <title>Recall desk · Torquetrail</title>
      <h1 className="page-title">Recall desk</h1>
      <p className="recall-desk__note">Last status per implant: {MAINTENANCE_NOTE}</p>
      <div className="recall-desk__controls">
        <FormGroup label="Show" labelFor="desk-filter">
          <HTMLSelect
            id="desk-filter"
            data-testid="desk-filter"
            value={params.filter}
            onChange={(e) => set({ filter: e.currentTarget.value })}
          >
            {DESK_FILTERS.map((f) => (
              <option key={f} value={f}>
                {DESK_FILTER_LABEL[f]}
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        <LiveSearch
          id="desk-search"
          label="Search"
          placeholder="Name or chart number"
          value={params.search ?? ''}
          onSearch={(search) => {
            if (search !== (params.search ?? '')) set({ search });
          }}
          busy={desk.isFetching && !desk.isPending}
        />
        <Switch
          label="Show archived"
          checked={params.archived === 'all'}
          onChange={() => set({ archived: params.archived === 'all' ? undefined : 'all' })}
          data-testid="desk-show-archived"
          className="recall-desk__archived"
        />
        <AnchorButton
          icon="download"
          href={`/api/recalls/desk/csv${deskSearch(params, false)}`}
          download="recall-desk.csv"
        >
          Export CSV
        </AnchorButton>
        <Can I="update" a="RecallPolicy">
          <Link to="/recalls/policy">Recall policy</Link>
        </Can>
        <Can I="read" a="AuditEntry">
          <Link to="/recalls/reminders">Reminder log</Link>
        </Can>
      </div>
      {desk.isPending ? (
        <LoadingState label="Loading the Recall desk" />
      ) : desk.isError ? (
        <ErrorState title="Could not load the Recall desk" error={desk.error} onRetry={() => void desk.refetch()} />
      ) : desk.data.total === 0 ? (
        <NonIdealState icon="calendar" title="Nobody here" description="No patient with implants matches this view." />
      ) : (
        <div aria-busy={desk.isFetching}>
          <p className="result-count" aria-live="polite" data-testid="recall-desk-count">
            {desk.data.items.length === 0
              ? `No patients on this page; ${desk.data.total} in all.`
              : `${desk.data.total} ${desk.data.total === 1 ? 'patient' : 'patients'} · today ${formatDate(desk.data.today)}`}
          </p>
          {desk.data.items.length > 0 && (
            <HTMLTable className="recall-desk__table" striped compact data-testid="recall-desk-table">
              <thead>
                <tr>
                  {header('name')}
                  <th>Chart</th>
                  {header('dueOn')}
                  {header('overdueDays')}
                  {header('lastExamOn')}
                  <th>Last status per implant</th>
                  <th>Risk factors</th>
                  <th>
                    <span className="visually-hidden">Exam</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {desk.data.items.map((r) => (
                  <tr key={r.patientId}>
                    <td>
                      <Link to={`/patients/${r.patientId}`}>{r.name}</Link>
                    </td>
                    <td>
                      <ChartNumber value={r.chartNumber} />
                    </td>
                    <td>{r.nextDueOn ? formatDate(r.nextDueOn) : '—'}</td>
                    <td className={r.overdueDays > 0 ? 'recall-overdue' : undefined}>
                      {r.overdueDays > 0 ? `${r.overdueDays} days` : '—'}
                    </td>
                    <td>{r.lastExamOn ? formatDate(r.lastExamOn) : 'never'}</td>
                    <td>
                      <span className="recall-desk__sites">
                        {r.sites.map((s) => (
                          <span key={s.siteId}>
                            <strong>{s.fdi}</strong> <MaintenanceStatusLabel status={s.status} />
                          </span>
                        ))}
                      </span>
                      {r.provisionalsOverdue?.map((p) => (
                        // No warning intent: Blueprint's minimal warning text fails WCAG AA contrast here (axe).
                        <Tag
                          key={p.restorationId}
                          minimal
                          icon="time"
                          className="recall-desk__provisional"
                          data-testid="desk-provisional-overdue"
                        >
                          Provisional at {p.fdis.join(', ')}: replacement was planned for{' '}
                          {formatDate(p.plannedReplacementOn)}
                        </Tag>
                      ))}
                      {r.insertReviewsOverdue?.map((o) => (
                        <Tag
                          key={o.restorationId}
                          minimal
                          icon="exchange"
                          className="recall-desk__provisional"
                          data-testid="desk-insert-review-overdue"
                        >
                          Overdenture at {o.fdis.join(', ')}: insert review due {formatDate(o.reviewDueOn)} (
                          {o.lastChangeOn
                            ? `last insert change ${formatDate(o.lastChangeOn)}`
                            : 'no change since delivery'}
                          )
                        </Tag>
                      ))}
                    </td>
                    <td>
                      {riskText(r.riskFactors).map((t) => (
                        <Tag key={t} minimal style={{ marginRight: 4 }}>
                          {t}
                        </Tag>
                      ))}
                    </td>
                    <td>
                      <Can I="create" a="RecallExam">
                        <Link to={`/recalls/patients/${r.patientId}/exam`}>Record exam</Link>
                      </Can>
                    </td>
                  </tr>
                ))}
              </tbody>
            </HTMLTable>
          )}
          <PageSwitcher
            page={params.page ?? 1}
            pageSize={PAGE_SIZE}
            total={desk.data.total}
            label="Pages of the Recall desk"
            onGo={(page) => set({ page: String(page) })}
          />
        </div>
      )}
    </div>
  );
}
