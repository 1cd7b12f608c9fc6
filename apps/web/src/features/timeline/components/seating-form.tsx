import { Button, Callout, TextArea } from '@blueprintjs/core';
import {
  type Radiograph,
  SEATING_ANSWERS,
  SeatingAmendmentBody,
  type SeatingAnswer,
  type SeatingCheck,
  SeatingCheckBody,
  type SeatingEvent,
} from '@torquetrail/contracts';
import { useMemo, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { SEATING_ANSWER_LABEL, SEATING_EVENT_LABEL } from '../../../lib/clinical-labels';
import { formatDate } from '../../../lib/dates';
import {
  applyServerErrors,
  draftSchema,
  FormField,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { RADIOGRAPH_KIND_LABEL } from '../../../lib/labels';
import { useRadiographs } from '../../radiographs';
import { type SeatingSave, useSaveSeating, useSeatingChecks } from '../api/seating';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';
import './timeline.css';

interface SeatingDraft {
  /** '' = none chosen yet. */
  radiographId: string;
  seated: SeatingAnswer | '';
  note: string;
  reason: string;
}

interface Target {
  siteId: string;
  patientId: string;
  restorationId: string;
  event: SeatingEvent;
  /** The day of the delivery or impression: older radiographs cannot show it. */
  eventOn: string;
}

/** Radiographs that can show this seating: of this site (or of no named site), not older than the event. */
function offered(items: Radiograph[], t: Target) {
  return items.filter(
    (r) => (r.siteIds.length === 0 || r.siteIds.includes(t.siteId)) && (r.takenOn === null || r.takenOn >= t.eventOn),
  );
}

function SeatingForm({
  target,
  current,
  onDone,
}: {
  target: Target;
  current: SeatingCheck | null;
  onDone: () => void;
}) {
  const radiographs = useRadiographs(target.patientId);
  const save = useSaveSeating(target.restorationId);
  const schema = useMemo(
    () =>
      current
        ? draftSchema(SeatingAmendmentBody, (d: SeatingDraft) => ({
            radiographId: d.radiographId,
            // '' (nothing chosen) is refused by the contract with its own words.
            seated: d.seated as SeatingAnswer,
            note: d.note || null,
            reason: d.reason,
          }))
        : draftSchema(SeatingCheckBody, (d: SeatingDraft) => ({
            event: target.event,
            radiographId: d.radiographId,
            // '' (nothing chosen) is refused by the contract with its own words.
            seated: d.seated as SeatingAnswer,
            note: d.note || null,
          })),
    [current, target.event],
  );
  const form = useContractForm<SeatingDraft, SeatingSave['body']>(schema, {
    radiographId: current?.radiographId ?? '',
    seated: current?.seated ?? '',
    note: current?.note ?? '',
    reason: '',
  });
  const submit = (body: SeatingSave['body']) => {
    const handlers = { onSuccess: onDone, onError: (error: Error) => applyServerErrors(form.setError, error) };
    // Only the amendment's contract has a reason, so its presence says which request this is.
    if ('reason' in body) {
      if (current) runMutation(save, { amendId: current.id, body }, handlers);
    } else runMutation(save, { amendId: null, body }, handlers);
  };
  const choices = radiographs.data ? offered(radiographs.data.items, target) : [];
  const formError = formErrorMessage(form.formState.errors, 'alone');
  const what = SEATING_EVENT_LABEL[target.event].toLowerCase();

  return (
    <FormProvider {...form}>
      <form
        onSubmit={(e) => void form.handleSubmit(submit)(e)}
        className="torque-form seating-form"
        aria-label={`Confirm seating at the ${what}`}
        noValidate
      >
        {current && (
          <Callout compact icon="history">
            Recorded: {SEATING_ANSWER_LABEL[current.seated].toLowerCase()}, by {current.recordedBy}. Saving makes a new
            version; the old one stays in the Timeline, marked amended.
          </Callout>
        )}
        <FormField name="radiographId" label={`Radiograph showing the ${what}`}>
          {radiographs.isPending ? (
            <p>Loading radiographs…</p>
          ) : radiographs.isError ? (
            <p role="alert">The radiographs could not be loaded: {radiographs.error.message}</p>
          ) : choices.length === 0 ? (
            <p>
              No radiograph of this site taken on or after {formatDate(target.eventOn)}.{' '}
              <Link to={`/patients/${target.patientId}/radiographs`}>Upload one</Link> first.
            </p>
          ) : (
            <div className="seating-form__choices" role="radiogroup" aria-label="Radiograph">
              {choices.map((r) => (
                <label key={r.id} className="seating-form__choice" data-testid="seating-radiograph">
                  <input type="radio" value={r.id} {...form.register('radiographId')} />
                  {r.previewProblem ? (
                    <span className="seating-form__no-preview">{r.previewProblem}</span>
                  ) : (
                    <img src={`/api/radiographs/${r.id}/thumbnail`} alt="" />
                  )}
                  <span>
                    {RADIOGRAPH_KIND_LABEL[r.kind]}, {r.takenOn ? formatDate(r.takenOn) : 'date not known'}
                  </span>
                </label>
              ))}
            </div>
          )}
        </FormField>
        <FormField name="seated" label="Are the parts seated?">
          <div role="radiogroup" aria-label="Are the parts seated?" className="seating-form__answers">
            {SEATING_ANSWERS.map((a) => (
              <label key={a}>
                <input type="radio" value={a} {...form.register('seated')} /> {SEATING_ANSWER_LABEL[a]}
              </label>
            ))}
          </div>
        </FormField>
        <FormField name="note" label="Note (optional)" labelFor="seating-note">
          <TextArea id="seating-note" fill {...withInputRef(form.register('note'))} />
        </FormField>
        {current && (
          <FormField name="reason" label="Why is the check amended?" labelFor="seating-reason">
            <TextArea id="seating-reason" fill {...withInputRef(form.register('reason'))} />
          </FormField>
        )}
        {formError && (
          <Callout intent="danger" role="alert" compact>
            {formError}
          </Callout>
        )}
        <div className="torque-form__actions">
          <Button type="submit" intent="primary" text="Save seating check" loading={save.isPending} />
          <Button variant="minimal" text="Cancel" onClick={onDone} />
        </div>
      </form>
    </FormProvider>
  );
}

function SeatingButton(target: Target) {
  const [open, setOpen] = useState(false);
  useCloseOnEscape(open, () => setOpen(false));
  const checks = useSeatingChecks(target.restorationId);
  const current = checks.data?.items.find((c) => c.event === target.event && c.current) ?? null;
  return (
    <>
      <Button
        small
        variant="minimal"
        icon="tick-circle"
        text={current ? 'Amend seating check' : 'Confirm seating'}
        aria-expanded={open}
        onClick={() => setOpen((v) => !v)}
        data-testid="confirm-seating"
      />
      {open &&
        (checks.isPending ? (
          <p>Loading the seating checks…</p>
        ) : checks.isError ? (
          <p role="alert">The seating checks could not be loaded: {checks.error.message}</p>
        ) : (
          <SeatingForm target={target} current={current} onDone={() => setOpen(false)} />
        ))}
    </>
  );
}

/**
 * "Confirm seating" on a delivery or impression of the Timeline, for who may write restorations
 * (the dentist): a first check, or an amendment of the current one.
 */
export function SeatingPanel(target: Target) {
  return (
    <Can I="create" a="Restoration">
      <SeatingButton {...target} />
    </Can>
  );
}
