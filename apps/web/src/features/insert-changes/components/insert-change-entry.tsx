import { Button } from '@blueprintjs/core';
import { type InsertChange, InsertChangeAmendmentBody, type SiteFile } from '@torquetrail/contracts';
import { useEffect, useMemo, useRef, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { INSERT_CHANGE_REASON_LABEL } from '../../../lib/clinical-labels';
import { formatDate } from '../../../lib/dates';
import { AmendmentForm, applyServerErrors, draftSchema, useContractForm } from '../../../lib/forms';
import { runMutation } from '../../../lib/run-mutation';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { AMEND_INSERT_CHANGE_PARAM } from '../amend-link';
import { useAmendInsertChange } from '../api/amend-insert-change';
import { InsertChangeFields, type InsertDraft, useInsertParts } from './insert-change-fields';
import { strengthText } from './insert-strength';

/** One change of the card, with "Amend" (a new version with its reason; the Stack follows it). */
export function InsertChangeEntry({ site, change }: { site: SiteFile; change: InsertChange }) {
  const [params, setParams] = useSearchParams();
  const asked = params.get(AMEND_INSERT_CHANGE_PARAM) === change.id;
  // Opened by its own button, or by the Timeline's link (the search parameter) until closed.
  const [opened, setOpen] = useState(false);
  const open = opened || asked;
  const item = useRef<HTMLLIElement>(null);
  useEffect(() => {
    if (asked) item.current?.scrollIntoView({ block: 'center' });
  }, [asked]);
  const close = () => {
    setOpen(false);
    if (asked)
      setParams(
        (p) => {
          p.delete(AMEND_INSERT_CHANGE_PARAM);
          return p;
        },
        { replace: true },
      );
  };
  useCloseOnEscape(open, close);
  return (
    <li data-testid="insert-change" ref={item}>
      <strong>{formatDate(change.changedOn)}</strong>: {INSERT_CHANGE_REASON_LABEL[change.reason]} —{' '}
      {change.oldPart ? `${strengthText(change.oldPart)} → ` : ''}
      {strengthText(change.newPart)}
      {change.notes ? `. ${change.notes}` : ''}
      {change.supersedesId ? ` (amended record: ${change.amendmentReason ?? 'no reason given'})` : ''}{' '}
      <Can I="amend" a="InsertChange">
        {open ? (
          <AmendInsertChange site={site} change={change} onDone={close} />
        ) : (
          <Button
            small
            variant="minimal"
            icon="edit"
            text="Amend"
            aria-label={`Amend the insert change of ${formatDate(change.changedOn)}`}
            onClick={() => setOpen(true)}
          />
        )}
      </Can>
    </li>
  );
}

function AmendInsertChange({ site, change, onDone }: { site: SiteFile; change: InsertChange; onDone: () => void }) {
  const parts = useInsertParts(site);
  const amend = useAmendInsertChange(site.id);
  const schema = useMemo(
    () =>
      draftSchema(InsertChangeAmendmentBody, (d: InsertDraft & { amendmentReason: string }) => ({
        changedOn: d.changedOn,
        oldComponentId: d.oldComponentId || null,
        newComponentId: d.newComponentId,
        reason: d.reason,
        notes: d.notes || null,
        amendmentReason: d.amendmentReason,
      })),
    [],
  );
  const form = useContractForm(schema, {
    changedOn: change.changedOn,
    oldComponentId: change.oldPart?.componentId ?? '',
    newComponentId: change.newPart.componentId,
    reason: change.reason,
    notes: change.notes ?? '',
    amendmentReason: '',
  });
  // The first field takes the focus, so the form is filled from the keyboard where it opened.
  useEffect(() => form.setFocus('changedOn'), [form]);
  const submit = (body: InsertChangeAmendmentBody) =>
    runMutation(
      amend,
      { id: change.id, body },
      { onSuccess: onDone, onError: (error) => applyServerErrors(form.setError, error) },
    );
  return (
    <AmendmentForm
      form={form}
      onSubmit={submit}
      idPrefix={`amend-insert-${change.id}`}
      pending={amend.isPending}
      onCancel={onDone}
      className="insert-changes__form"
    >
      <InsertChangeFields idPrefix={`amend-insert-${change.id}`} parts={parts} />
    </AmendmentForm>
  );
}
