import { Card } from '@blueprintjs/core';
import { MANUFACTURER_CAUTION, type SiteFile, type SiteInsertChanges } from '@torquetrail/contracts';
import { formatDate } from '../../../lib/dates';
import { InsertChangeEntry } from './insert-change-entry';
import { LogInsertChange } from './log-insert-change';
import './insert-changes.css';

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** "5 months (153 days)" since the last change, or since delivery when none is logged. */
function intervalText(s: SiteInsertChanges): string {
  if (s.lastChangeOn === null || s.daysSinceLast === null || s.monthsSinceLast === null)
    return `No change logged since delivery on ${formatDate(s.deliveredOn)}`;
  return `${plural(s.monthsSinceLast, 'month', 'months')} (${plural(s.daysSinceLast, 'day', 'days')}) since ${formatDate(s.lastChangeOn)}`;
}

/**
 * The retentive inserts of an overdenture site: the interval since the last change, the counts
 * per 12 months and per calendar year, the review due, the changes, and "Log insert change".
 */
export function InsertChangesCard({ site }: { site: SiteFile }) {
  const s = site.insertChanges;
  if (!s) return null;
  return (
    <Card className="insert-changes" data-testid="insert-changes" compact>
      <h2 className="insert-changes__title">Retentive inserts</h2>
      <dl className="insert-changes__facts">
        <div>
          <dt>Since the last change</dt>
          <dd data-testid="insert-interval">{intervalText(s)}</dd>
        </div>
        <div>
          <dt>Changes in the last 12 months</dt>
          <dd data-testid="insert-last-12">{s.last12Months}</dd>
        </div>
        <div>
          <dt>Per calendar year</dt>
          <dd data-testid="insert-per-year">
            {s.perYear.length === 0 ? 'None logged' : s.perYear.map((y) => `${y.year}: ${y.count}`).join(' · ')}
          </dd>
        </div>
        <div>
          <dt>Insert review</dt>
          <dd data-testid="insert-review">
            {s.reviewOverdue ? 'Overdue since ' : 'Due '}
            {formatDate(s.reviewDueOn)} (every {plural(s.reviewIntervalMonths, 'month', 'months')}, the practice&apos;s
            interval)
          </dd>
        </div>
      </dl>
      <LogInsertChange site={site} />
      {s.entries.length === 0 ? (
        <p className="insert-changes__empty">No insert change logged yet.</p>
      ) : (
        <ol className="insert-changes__list" aria-label="Insert changes, newest first">
          {s.entries.map((e) => (
            <InsertChangeEntry key={e.id} site={site} change={e} />
          ))}
        </ol>
      )}
      <p className="insert-changes__caution">
        <small>Strengths as the practice&apos;s catalogue states them. {MANUFACTURER_CAUTION}</small>
      </p>
    </Card>
  );
}
