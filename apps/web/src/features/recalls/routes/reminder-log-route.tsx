import '../components/recalls.css';
import { Button, Callout, HTMLTable, NonIdealState, Tag } from '@blueprintjs/core';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatDate, formatDateTime } from '../../../lib/dates';
import { REMINDER_KIND_LABEL, REMINDER_STATUS_LABEL } from '../../../lib/labels';
import { useReminderLog, useRunReminders } from '../api/recalls-api';
import { ChartNumber } from '../../../lib/components/chart-number';

/** /recalls/reminders: every reminder e-mail, once per patient, recall date and kind (practice admin). */
export function ReminderLogRoute() {
  const log = useReminderLog();
  const run = useRunReminders();
  return (
    <div className="reminder-log">
      <title>Reminder log · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Recall desk', to: '/recalls' }, { text: 'Reminder log' }]} />
      <h1 className="page-title">Reminder log</h1>
      <p>
        The daily scan runs every morning; each reminder is sent once, retried with back-off when the mail server is
        down.{' '}
        <Button icon="play" loading={run.isPending} onClick={() => run.mutate()}>
          Run the scan now
        </Button>
      </p>
      {run.data && (
        <Callout intent="success" compact>
          Scanned {formatDate(run.data.today)}: {run.data.logged} new, {run.data.queued} queued for sending.
        </Callout>
      )}
      {log.isPending ? (
        <LoadingState label="Loading the reminder log" />
      ) : log.isError ? (
        <ErrorState title="Could not load the reminder log" error={log.error} onRetry={() => void log.refetch()} />
      ) : log.data.items.length === 0 ? (
        <NonIdealState icon="envelope" title="No reminders yet" />
      ) : (
        <HTMLTable striped compact data-testid="reminder-log-table">
          <thead>
            <tr>
              <th>Patient</th>
              <th>Recall due</th>
              <th>Kind</th>
              <th>Status</th>
              <th>Attempts</th>
              <th>Sent</th>
              <th>Last error</th>
            </tr>
          </thead>
          <tbody>
            {log.data.items.map((r) => (
              <tr key={r.id}>
                <td>
                  {r.patientName} (<ChartNumber value={r.chartNumber} />)
                </td>
                <td>{formatDate(r.recallDueOn)}</td>
                <td>{REMINDER_KIND_LABEL[r.kind]}</td>
                <td>
                  <Tag minimal intent={r.status === 'sent' ? 'success' : r.status === 'failed' ? 'danger' : 'warning'}>
                    {REMINDER_STATUS_LABEL[r.status].toLowerCase()}
                  </Tag>
                </td>
                <td>{r.attempts}</td>
                <td>{r.sentAt ? formatDateTime(r.sentAt) : '—'}</td>
                <td>{r.lastError ?? ''}</td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      )}
    </div>
  );
}
