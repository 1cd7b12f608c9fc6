import { Button, Callout, Checkbox, Icon, type IconName, NonIdealState, Tag } from '@blueprintjs/core';
import {
  type ComponentKind,
  DENTURE_RETAINER_KINDS,
  type StackPart,
  type TimelineEvent,
  type TimelineKind,
} from '@torquetrail/contracts';
import { ComplicationPanel } from './complication-form';
import { AmendForm } from './amend-form';
import { Can } from '../../../lib/ability';
import { lazy, Suspense, useState } from 'react';
import { formatDate, formatDateTime } from '../../../lib/dates';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { useTimeline } from '../api/get-timeline';
import { amendInsertChangeSearch } from '../../insert-changes';
import { TorqueChart } from './torque-chart';
import { SeatingPanel } from './seating-form';
import { Link } from 'react-router-dom';
import { TORQUE_VERDICT_LABEL } from '../../../lib/clinical-labels';
import { TIMELINE_KIND_LABEL } from '../../../lib/labels';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import './timeline.css';

const InsertChangeChart = lazy(() => import('./insert-change-chart'));

/** Icon per kind, in the order of the filter checkboxes. */
const KIND_ICON: Record<TimelineKind, IconName> = {
  placement: 'pin',
  plan: 'clipboard',
  impression: 'duplicate',
  'lab-prescription': 'document',
  part: 'cube',
  delivery: 'endorsed',
  torque: 'wrench',
  complication: 'warning-sign',
  'recall-exam': 'pulse',
  radiograph: 'media',
  'bone-level': 'timeline-line-chart',
  'seating-check': 'tick-circle',
  'referral-summary': 'envelope',
  'passport-mail': 'envelope',
  'imported-part': 'cube-add',
  'insert-change': 'exchange',
};

/** A radiograph entry's thumbnail, or the link to the radiograph an entry was read from. */
function RadiographLink({ event, patientId }: { event: TimelineEvent; patientId: string }) {
  if (!event.radiographId) return null;
  const to = `/patients/${patientId}/radiographs/${event.radiographId}`;
  if (event.kind === 'radiograph')
    return (
      <Link to={to} data-testid="timeline-radiograph">
        <img className="timeline__thumbnail" src={`/api/radiographs/${event.radiographId}/thumbnail`} alt="" />
        Open in the viewer
      </Link>
    );
  return <Link to={to}>Open the radiograph</Link>;
}

function EventRow({ event, siteId, patientId }: { event: TimelineEvent; siteId: string; patientId: string }) {
  const [amending, setAmending] = useState(false);
  useCloseOnEscape(amending, () => setAmending(false));
  const amendable = !event.amended && (event.kind === 'torque' || event.kind === 'complication');
  const seatingEvent = !event.amended && (event.kind === 'delivery' || event.kind === 'impression') ? event.kind : null;
  return (
    <li
      className={`timeline__event${event.amended ? ' timeline__event--amended' : ''}${event.enteredInErrorReason ? ' timeline__event--error' : ''}`}
      data-testid="timeline-event"
      data-kind={event.kind}
    >
      <time dateTime={event.at}>{event.dateOnly ? formatDate(event.at) : formatDateTime(event.at)}</time>
      <span className="timeline__kind">
        <Icon icon={KIND_ICON[event.kind]} size={12} /> {TIMELINE_KIND_LABEL[event.kind]}
      </span>
      <span className="timeline__title">
        {event.title}
        {event.verdict && (
          <Tag
            minimal
            intent={event.verdict === 'within' ? 'success' : event.verdict === 'under' ? 'warning' : 'danger'}
            className="timeline__verdict"
          >
            {TORQUE_VERDICT_LABEL[event.verdict].toLowerCase()}
          </Tag>
        )}
        {event.amended && (
          <Tag minimal intent="none" icon="history" className="timeline__amended">
            amended (superseded by a later version)
          </Tag>
        )}
        {event.enteredInErrorReason && (
          <Tag minimal intent="danger" icon="disable" className="timeline__amended">
            {event.kind === 'radiograph' ? 'entered in error' : 'radiograph entered in error'}:{' '}
            {event.enteredInErrorReason}
          </Tag>
        )}
        {event.importedFrom && (
          <Tag minimal intent="primary" icon="import" className="timeline__amended" data-testid="timeline-imported">
            imported from {event.importedFrom}
          </Tag>
        )}
        {event.detail && <span className="timeline__detail">{event.detail}</span>}
        {event.amendmentReason && <span className="timeline__detail">Amendment: {event.amendmentReason}</span>}
        {event.byName && <span className="timeline__by">{event.byName}</span>}
        <RadiographLink event={event} patientId={patientId} />
        {seatingEvent && (
          <SeatingPanel
            siteId={siteId}
            patientId={patientId}
            restorationId={event.id}
            event={seatingEvent}
            eventOn={event.at.slice(0, 10)}
          />
        )}
        {event.kind === 'insert-change' && !event.amended && (
          <Can I="amend" a="InsertChange">
            {/* Amended on the insert changes card, where the Stack it moves is shown too. */}
            <Link to={{ search: amendInsertChangeSearch(event.id) }} data-testid="timeline-amend-insert-change">
              Amend on the insert changes card
            </Link>
          </Can>
        )}
        {amendable && (
          <Can I="amend" a={event.kind === 'torque' ? 'TorqueEvent' : 'Complication'}>
            {amending ? (
              <AmendForm siteId={siteId} event={event} onDone={() => setAmending(false)} />
            ) : (
              <Button small variant="minimal" icon="edit" text="Amend" onClick={() => setAmending(true)} />
            )}
          </Can>
        )}
      </span>
    </li>
  );
}

/** The Timeline: every event of the site in time order, filterable by kind, with torque charts per part. */
export function Timeline({ siteId, patientId, parts }: { siteId: string; patientId: string; parts: StackPart[] }) {
  const timeline = useTimeline(siteId);
  const [hidden, setHidden] = useState<Set<TimelineKind>>(new Set());
  if (timeline.isPending) return <LoadingState label="Loading the Timeline" />;
  if (timeline.isError)
    return (
      <ErrorState title="Could not load the Timeline" error={timeline.error} onRetry={() => void timeline.refetch()} />
    );
  const present = (Object.keys(KIND_ICON) as TimelineKind[]).filter((k) =>
    timeline.data.events.some((e) => e.kind === k),
  );
  const events = timeline.data.events.filter((e) => !hidden.has(e.kind));
  const toggle = (k: TimelineKind) =>
    setHidden((h) => {
      const next = new Set(h);
      if (next.has(k)) next.delete(k);
      else next.add(k);
      return next;
    });

  return (
    <section className="timeline" aria-labelledby="timeline-heading" data-testid="timeline">
      <div className="section-heading">
        <h2 id="timeline-heading">Timeline</h2>
        <ComplicationPanel siteId={siteId} parts={parts} />
      </div>
      <fieldset className="timeline__filters">
        <legend>Show</legend>
        {present.map((k) => (
          <Checkbox key={k} inline label={TIMELINE_KIND_LABEL[k]} checked={!hidden.has(k)} onChange={() => toggle(k)} />
        ))}
      </fieldset>
      {events.length === 0 ? (
        <NonIdealState icon="timeline-events" title="Nothing to show" description="No events of the chosen kinds." />
      ) : (
        <ol className="timeline__list">
          {events.map((e) => (
            <EventRow key={e.key} event={e} siteId={siteId} patientId={patientId} />
          ))}
        </ol>
      )}
      {/* An overdenture site (an insert or clip in its Stack) charts its insert changes, or says there are none. */}
      {parts.some((p) => (DENTURE_RETAINER_KINDS as readonly ComponentKind[]).includes(p.kind)) && (
        <div className="timeline__charts">
          <h3>Insert changes per year</h3>
          <Suspense fallback={<LoadingState label="Loading the chart" />}>
            <InsertChangeChart events={timeline.data.events} />
          </Suspense>
        </div>
      )}
      {timeline.data.torqueSeries.length > 0 && (
        <div className="timeline__charts">
          <h3>Torque history per part</h3>
          <Callout compact icon="info-sign">
            Shaded band: the part's specification ± its tolerance, as entered in the catalogue.
          </Callout>
          {timeline.data.torqueSeries.map((s) => (
            <TorqueChart key={s.componentInstanceId} series={s} />
          ))}
        </div>
      )}
    </section>
  );
}
