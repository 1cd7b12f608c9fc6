import { Button, Callout, Card, HTMLSelect, TextArea } from '@blueprintjs/core';
import {
  type CatalogueComponent,
  DENTURE_RETAINER_KINDS,
  InsertChangeBody,
  type InsertChangeReason,
  type InsertPart,
  MANUFACTURER_CAUTION,
  type SiteFile,
  type SiteInsertChanges,
} from '@torquetrail/contracts';
import { useMemo, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import { INSERT_CHANGE_REASON_LABEL } from '../../../lib/clinical-labels';
import { formatDate, localToday } from '../../../lib/dates';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  formErrorMessage,
  FormField,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { runMutation } from '../../../lib/run-mutation';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { useCatalogue } from '../../catalogue';
import { useLogInsertChange } from '../api/log-insert-change';
import './insert-changes.css';

/** An insert's strength as the practice's catalogue states it: its label, and its force when stated. */
function strengthText(p: Pick<InsertPart, 'name' | 'retentionLabel' | 'retentionN'>): string {
  const label = p.retentionLabel ?? 'strength not stated';
  return `${p.name} (${label}${p.retentionN !== null ? `, ${p.retentionN} N` : ''})`;
}

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
            <li key={e.id} data-testid="insert-change">
              <strong>{formatDate(e.changedOn)}</strong>: {INSERT_CHANGE_REASON_LABEL[e.reason]} —{' '}
              {e.oldPart ? `${strengthText(e.oldPart)} → ` : ''}
              {strengthText(e.newPart)}
              {e.notes ? `. ${e.notes}` : ''}
              {e.supersedesId ? ' (amended record)' : ''}
            </li>
          ))}
        </ol>
      )}
      <p className="insert-changes__caution">
        <small>Strengths as the practice&apos;s catalogue states them. {MANUFACTURER_CAUTION}</small>
      </p>
    </Card>
  );
}

interface InsertDraft {
  changedOn: string;
  /** '' = not known. */
  oldComponentId: string;
  newComponentId: string;
  reason: InsertChangeReason;
  notes: string;
}

/** The inserts (and, on a bar, clips) of the site's platform in the practice's catalogue. */
function useInsertParts(site: SiteFile): CatalogueComponent[] {
  const catalogue = useCatalogue();
  // A stud overdenture takes inserts; a bar, clips or inserts (as the API accepts).
  const kinds: readonly string[] =
    site.restoration?.kind === 'overdenture-bar' ? DENTURE_RETAINER_KINDS : ['retentive-insert'];
  const platforms = (catalogue.data?.systems ?? [])
    .filter((sys) => !site.placement || sys.name === site.placement.systemName)
    .flatMap((sys) => sys.platforms)
    .filter((p) => !site.placement || p.name === site.placement.platformName);
  return platforms.flatMap((p) => p.components).filter((c) => kinds.includes(c.kind));
}

function LogInsertChange({ site }: { site: SiteFile }) {
  const [open, setOpen] = useState(false);
  useCloseOnEscape(open, () => setOpen(false));
  const parts = useInsertParts(site);
  const schema = useMemo(
    () =>
      draftSchema(InsertChangeBody, (d: InsertDraft) => ({
        siteId: site.id,
        changedOn: d.changedOn,
        oldComponentId: d.oldComponentId || null,
        newComponentId: d.newComponentId,
        reason: d.reason,
        notes: d.notes || null,
      })),
    [site.id],
  );
  const form = useContractForm(schema, {
    changedOn: localToday(),
    oldComponentId: '',
    newComponentId: '',
    reason: 'wear',
    notes: '',
  });
  const log = useLogInsertChange(site.id);
  const submit = (body: InsertChangeBody) =>
    runMutation(log, body, {
      onSuccess: () => {
        form.reset();
        setOpen(false);
      },
      onError: (error) => applyServerErrors(form.setError, error),
    });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  const options = parts.map((p) => (
    <option key={p.id} value={p.id}>
      {strengthText({ name: p.name, retentionLabel: p.retentionLabel, retentionN: p.retentionN })}
    </option>
  ));
  return (
    <Can I="create" a="InsertChange">
      <Button
        icon="exchange"
        text="Log insert change"
        onClick={() => setOpen((v) => !v)}
        aria-expanded={open}
        data-testid="log-insert-change"
      />
      {open && (
        <FormProvider {...form}>
          <form
            onSubmit={(event) => void form.handleSubmit(submit)(event)}
            className="insert-changes__form"
            aria-label="Log insert change"
            noValidate
          >
            <FormField name="changedOn" label="Date of the change" labelFor="insert-date">
              <DateField id="insert-date" name="changedOn" />
            </FormField>
            <FormField name="oldComponentId" label="Insert taken out" labelFor="insert-old">
              <HTMLSelect id="insert-old" {...form.register('oldComponentId')}>
                <option value="">Not known</option>
                {options}
              </HTMLSelect>
            </FormField>
            <FormField
              name="newComponentId"
              label="New insert"
              labelFor="insert-new"
              help={parts.length === 0 ? 'The catalogue lists no insert for this platform: add one first.' : undefined}
            >
              <HTMLSelect id="insert-new" {...form.register('newComponentId')}>
                <option value="">Choose the insert put in</option>
                {options}
              </HTMLSelect>
            </FormField>
            <FormField name="reason" label="Reason" labelFor="insert-reason">
              <HTMLSelect id="insert-reason" {...form.register('reason')}>
                {Object.entries(INSERT_CHANGE_REASON_LABEL).map(([v, t]) => (
                  <option key={v} value={v}>
                    {t}
                  </option>
                ))}
              </HTMLSelect>
            </FormField>
            <FormField name="notes" label="Note (optional)" labelFor="insert-notes">
              <TextArea id="insert-notes" fill {...withInputRef(form.register('notes'))} />
            </FormField>
            {formError && (
              <Callout intent="danger" role="alert" compact>
                {formError}
              </Callout>
            )}
            <div className="insert-changes__actions">
              <Button type="submit" intent="primary" text="Save insert change" loading={log.isPending} />
              <Button variant="minimal" text="Cancel" onClick={() => setOpen(false)} />
            </div>
          </form>
        </FormProvider>
      )}
    </Can>
  );
}
