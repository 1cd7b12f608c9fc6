import '../components/planner.css';
import { Button, Callout, Checkbox, HTMLSelect, InputGroup, TextArea } from '@blueprintjs/core';
import {
  type CatalogueComponent,
  type CatalogueReply,
  type Material,
  PlanAmendmentBody,
  PlanBody,
  type PlanBodyParsed,
  type RestorableSite,
  type RestorationDetail,
  type RestorationKind,
  type Retention,
  findingField,
} from '@torquetrail/contracts';
import { formatTooth, recordsCantilevers } from '@torquetrail/domain';
import { useMemo, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import type { z } from 'zod';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import {
  applyServerErrors,
  draftSchema,
  FieldError,
  FormField,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { useToothSystem } from '../../../lib/tooth-system';
import { useCantileverSettings, useCatalogue } from '../../catalogue';
import { useAmendPlan, useRestorableSites, useRestorations, useSavePlan } from '../api/planner-api';
import { FindingsPanel } from '../components/findings-panel';
import {
  ackKey,
  emptySitePlan,
  initialPlan,
  judgedAxes,
  liveFindings,
  type PlanState,
  stateFromRestoration,
  toBody,
} from '../components/plan-state';
import { SitePlanFields } from '../components/site-plan-fields';
import { DivergenceTable } from '../components/divergence-table';
import { MATERIAL_LABEL, RESTORATION_KIND_LABEL as KIND_LABEL, RETENTION_LABEL } from '../../../lib/clinical-labels';
import { usePatient } from '../../patients';
import { DateInput } from '../../../lib/components/date-input';
import { runMutation } from '../../../lib/run-mutation';

/**
 * /patients/:patientId/restorations/new: the restoration planner with live Findings.
 * With `?amend=<id>` it starts from that planned restoration and saves an amendment.
 */
export function PlannerRoute() {
  const { patientId = '' } = useParams();
  const patient = usePatient(patientId);
  const patientName = patient.data ? `${patient.data.givenName} ${patient.data.familyName}` : 'Patient';
  const [search] = useSearchParams();
  const amendId = search.get('amend');
  const sites = useRestorableSites(patientId);
  const catalogue = useCatalogue();
  const restorations = useRestorations(patientId);
  const cantilever = useCantileverSettings();

  if (sites.isPending || catalogue.isPending || cantilever.isPending || (amendId && restorations.isPending))
    return <LoadingState label="Loading the planner" />;
  if (sites.isError || catalogue.isError || cantilever.isError)
    return (
      <ErrorState
        title="Could not load the planner"
        error={sites.error ?? catalogue.error ?? cantilever.error}
        onRetry={() => {
          void sites.refetch();
          void catalogue.refetch();
          void cantilever.refetch();
        }}
      />
    );
  return (
    <PlannerGate
      key={amendId ?? 'new'}
      patientId={patientId}
      patientName={patientName}
      restorable={sites.data.items}
      catalogue={catalogue.data}
      cantileverRatio={cantilever.data.cantileverRatioLimit}
      amendable={amendId ? restorations.data?.items.find((r) => r.id === amendId && isAmendable(r)) : undefined}
      amendId={amendId}
    />
  );
}

const isAmendable = (r: RestorationDetail) => r.status === 'planned' && !r.supersededById;

/**
 * Decides once, when the planner opens, which plan it amends. Saving an amendment supersedes that
 * plan and the refreshed list says so before the save navigates away: deciding again on every
 * render would swap the form for the "cannot be amended" notice and drop the save's navigation.
 */
function PlannerGate({
  amendable,
  amendId,
  ...props
}: Omit<Parameters<typeof PlannerForm>[0], 'amending'> & {
  amendable: RestorationDetail | undefined;
  amendId: string | null;
}) {
  const [amending] = useState(amendable);
  if (amendId && !amending) {
    return (
      <Callout intent="warning" title="This plan cannot be amended">
        It was delivered or amended already: amend its current version.{' '}
        <Link to={`/patients/${props.patientId}/restorations`}>Back to the restorations</Link>
      </Callout>
    );
  }
  return <PlannerForm {...props} amending={amending} />;
}

type PlanAmendmentParsed = z.output<typeof PlanAmendmentBody>;

/** The planner's form values: the plan as edited, and the reason when it amends a saved plan. */
interface PlannerDraft extends PlanState {
  amendmentReason: string;
}

/**
 * The plan form. Its inputs are controlled from the watched draft (not registered): the live
 * Findings read the whole draft on every change, choosing a site inserts it in arch order, and
 * several choices reset others. Every edit retires the last submit's field messages, as the live
 * Findings speak for the new draft; the form's message stays until the next submit.
 */
function PlannerForm({
  patientId,
  patientName,
  restorable: all,
  catalogue,
  cantileverRatio,
  amending,
}: {
  patientId: string;
  patientName: string;
  restorable: RestorableSite[];
  catalogue: CatalogueReply;
  /** The practice's cantilever limit (× A-P spread) the live Findings use. */
  cantileverRatio: number;
  amending?: RestorationDetail;
}) {
  const navigate = useNavigate();
  const [system] = useToothSystem();
  const save = useSavePlan();
  const amend = useAmendPlan();

  const parts = useMemo(() => {
    const map = new Map<string, CatalogueComponent>();
    for (const s of catalogue.systems) for (const p of s.platforms) for (const c of p.components) map.set(c.id, c);
    return map;
  }, [catalogue]);
  const restorable = useMemo(
    () => all.filter((s) => s.platformId && s.status !== 'failed' && s.status !== 'removed'),
    [all],
  );

  const schema = useMemo((): z.ZodType<PlanBodyParsed | PlanAmendmentParsed, PlannerDraft> => {
    // Only the warnings still raised are acknowledged (one acknowledged earlier may have gone).
    const planBody = (d: PlannerDraft) => {
      const { findings } = d.sites.length > 0 ? liveFindings(d, restorable, parts, cantileverRatio) : { findings: [] };
      return toBody(
        patientId,
        { ...d, acknowledged: d.acknowledged.filter((k) => findings.some((f) => ackKey(f) === k)) },
        parts,
        restorable,
      );
    };
    return amending
      ? draftSchema(PlanAmendmentBody, (d: PlannerDraft) => {
          const { patientId: _patientId, ...rest } = planBody(d);
          return { ...rest, amendmentReason: d.amendmentReason };
        })
      : draftSchema(PlanBody, planBody);
  }, [amending, cantileverRatio, parts, patientId, restorable]);
  const form = useContractForm(schema, {
    ...(amending ? stateFromRestoration(amending) : initialPlan),
    amendmentReason: '',
  });
  const state = form.watch();

  const chosen = state.sites.map((p) => restorable.find((s) => s.siteId === p.siteId)!);
  const { findings, invalid } =
    chosen.length > 0 ? liveFindings(state, restorable, parts, cantileverRatio) : { findings: [], invalid: {} };
  const fdis = chosen.map((s) => s.fdi);
  // Messages computed from the draft as it is now, shown beside their fields.
  const live: Record<string, string> = { ...invalid };
  for (const f of findings) if (f.severity === 'error') live[findingField(f, fdis)] ??= f.message;
  // Every value the rules cannot evaluate is an error Finding too (plan-state liveFindings): the list
  // says why whenever Save is blocked.
  const hasErrors = findings.some((f) => f.severity === 'error');
  const unacknowledged = findings.filter((f) => f.severity === 'warning' && !state.acknowledged.includes(ackKey(f)));

  const update = (patch: Partial<PlanState>) => {
    for (const key of Object.keys(patch) as (keyof PlanState)[]) form.setValue(key, patch[key]!);
    const fieldErrors = Object.keys(form.formState.errors).filter((name) => name !== 'root') as (keyof PlannerDraft)[];
    form.clearErrors(fieldErrors);
  };
  const toggleSite = (siteId: string, on: boolean) =>
    update({
      sites: on
        ? [...state.sites, emptySitePlan(siteId)].sort(
            (a, b) =>
              restorable.findIndex((s) => s.siteId === a.siteId) - restorable.findIndex((s) => s.siteId === b.siteId),
          )
        : state.sites.filter((s) => s.siteId !== siteId),
    });

  const submit = (body: PlanBodyParsed | PlanAmendmentParsed) => {
    const saved = {
      onSuccess: () => navigate(`/patients/${patientId}/restorations`),
      onError: (error: Error) => applyServerErrors(form.setError, error),
    };
    // The schema gives an amendment's body (with its reason) exactly when a saved plan is amended.
    if (!('amendmentReason' in body)) runMutation(save, body, saved);
    else if (amending) runMutation(amend, { id: amending.id, body }, saved);
  };
  const formError = formErrorMessage(form.formState.errors, 'always');
  const field = (name: string) => ({ name, live: live[name] });

  return (
    <div className="planner-page">
      <title>Restoration planner · Torquetrail</title>
      <BreadcrumbTrail
        items={[
          { text: 'Patients', to: '/patients' },
          { text: patientName, to: `/patients/${patientId}` },
          { text: 'Restorations', to: `/patients/${patientId}/restorations` },
          { text: 'New plan' },
        ]}
      />
      <h1>{amending ? 'Amend the plan' : 'Restoration planner'}</h1>
      {amending && (
        <Callout intent="primary" compact>
          The saved plan stays in the record, marked as amended; this saves a new version.
        </Callout>
      )}
      <FormProvider {...form}>
        <form
          onSubmit={(event) => void form.handleSubmit(submit)(event)}
          className="planner"
          noValidate
          aria-label="Restoration plan"
        >
          <div className="planner__main">
            <fieldset className="planner-sites" data-testid="planner-sites">
              <legend>Sites</legend>
              {restorable.length === 0 && (
                <Callout intent="primary">This patient has no placed implant to restore.</Callout>
              )}
              {restorable.map((s) => (
                <Checkbox
                  key={s.siteId}
                  inline
                  label={`${formatTooth(s.fdi, system)} (${s.platformName})`}
                  checked={state.sites.some((p) => p.siteId === s.siteId)}
                  onChange={(e) => toggleSite(s.siteId, e.currentTarget.checked)}
                />
              ))}
              <FieldError as="p" {...field('sites')} className="planner-error" role="alert" />
            </fieldset>
            <div className="planner-grid">
              <FormField {...field('kind')} label="Restoration" labelFor="plan-kind">
                <HTMLSelect
                  id="plan-kind"
                  value={state.kind}
                  onChange={(e) => update({ kind: e.currentTarget.value as RestorationKind })}
                >
                  {Object.entries(KIND_LABEL).map(([v, t]) => (
                    <option key={v} value={v}>
                      {t}
                    </option>
                  ))}
                </HTMLSelect>
              </FormField>
              <FormField {...field('retention')} label="Retention" labelFor="plan-retention">
                <HTMLSelect
                  id="plan-retention"
                  value={state.retention}
                  onChange={(e) => update({ retention: e.currentTarget.value as Retention })}
                >
                  {Object.entries(RETENTION_LABEL).map(([v, t]) => (
                    <option key={v} value={v}>
                      {t}
                    </option>
                  ))}
                </HTMLSelect>
              </FormField>
              <FormField {...field('material')} label="Material" labelFor="plan-material">
                <HTMLSelect
                  id="plan-material"
                  value={state.material}
                  onChange={(e) => update({ material: e.currentTarget.value as Material })}
                >
                  {Object.entries(MATERIAL_LABEL).map(([v, t]) => (
                    <option key={v} value={v}>
                      {t}
                    </option>
                  ))}
                </HTMLSelect>
              </FormField>
              <FormField {...field('shade')} label="Shade" labelFor="plan-shade">
                <InputGroup id="plan-shade" value={state.shade} onValueChange={(v) => update({ shade: v })} />
              </FormField>
            </div>
            <FormField {...field('copingsSplinted')}>
              <Checkbox
                label="Impression copings splinted together before the impression"
                checked={state.copingsSplinted}
                onChange={(e) => update({ copingsSplinted: e.currentTarget.checked })}
              />
            </FormField>
            <FormField {...field('provisional')}>
              <Checkbox
                label="Provisional restoration (a definitive one will replace it)"
                checked={state.provisional}
                onChange={(e) => update({ provisional: e.currentTarget.checked })}
                data-testid="plan-provisional"
              />
            </FormField>
            {state.provisional && (
              <FormField
                {...field('plannedReplacementOn')}
                label="Planned replacement date"
                labelFor="plan-replacement"
                help="The Recall desk lists the provisional once this day has passed."
              >
                <DateInput
                  id="plan-replacement"
                  value={state.plannedReplacementOn}
                  onChange={(v) => update({ plannedReplacementOn: v })}
                />
              </FormField>
            )}
            {recordsCantilevers(state.kind) && (
              <fieldset className="planner-grid" data-testid="plan-cantilevers">
                <legend>Cantilevers (practice limit {cantileverRatio} × A-P spread)</legend>
                <FormField
                  {...field('apSpreadMm')}
                  label="A-P spread (mm)"
                  labelFor="plan-ap-spread"
                  help="Measured: most anterior implant's centre to the line joining the distal sides of the most distal implants."
                >
                  <InputGroup
                    id="plan-ap-spread"
                    inputMode="decimal"
                    value={state.apSpreadMm}
                    onValueChange={(v) => update({ apSpreadMm: v })}
                  />
                </FormField>
                <FormField
                  {...field('cantileverRightMm')}
                  label="Distal cantilever, right (mm)"
                  labelFor="plan-cant-right"
                >
                  <InputGroup
                    id="plan-cant-right"
                    inputMode="decimal"
                    value={state.cantileverRightMm}
                    onValueChange={(v) => update({ cantileverRightMm: v })}
                  />
                </FormField>
                <FormField
                  {...field('cantileverLeftMm')}
                  label="Distal cantilever, left (mm)"
                  labelFor="plan-cant-left"
                >
                  <InputGroup
                    id="plan-cant-left"
                    inputMode="decimal"
                    value={state.cantileverLeftMm}
                    onValueChange={(v) => update({ cantileverLeftMm: v })}
                  />
                </FormField>
              </fieldset>
            )}
            {state.sites.map((p, i) => (
              <SitePlanFields
                key={p.siteId}
                index={i}
                site={chosen[i]}
                plan={p}
                retention={state.retention}
                kind={state.kind}
                parts={[...parts.values()].filter((c) => c.platformId === chosen[i].platformId)}
                system={system}
                live={live}
                onChange={(next) => update({ sites: state.sites.map((x, j) => (j === i ? next : x)) })}
              />
            ))}
            <div className="planner-grid">
              <FormField {...field('labName')} label="Laboratory" labelFor="plan-lab">
                <InputGroup id="plan-lab" value={state.labName} onValueChange={(v) => update({ labName: v })} />
              </FormField>
              <FormField {...field('labEmail')} label="Laboratory e-mail" labelFor="plan-lab-email">
                <InputGroup
                  id="plan-lab-email"
                  type="email"
                  value={state.labEmail}
                  onValueChange={(v) => update({ labEmail: v })}
                />
              </FormField>
              <FormField {...field('dueOn')} label="Due date" labelFor="plan-due">
                <DateInput id="plan-due" value={state.dueOn} onChange={(v) => update({ dueOn: v })} />
              </FormField>
            </div>
            <FormField {...field('notes')} label="Notes for the laboratory" labelFor="plan-notes">
              <TextArea
                id="plan-notes"
                value={state.notes}
                onChange={(e) => update({ notes: e.currentTarget.value })}
                fill
              />
            </FormField>
          </div>
          <aside className="planner__side">
            <FindingsPanel
              findings={findings}
              acknowledged={state.acknowledged}
              onAcknowledge={(k, on) =>
                update({ acknowledged: on ? [...state.acknowledged, k] : state.acknowledged.filter((x) => x !== k) })
              }
            />
            <DivergenceTable system={system} axes={judgedAxes(state, restorable, parts)} />
            <Callout intent="warning" icon="info-sign" compact className="planner-caution">
              {catalogue.caution}
            </Callout>
            {formError && (
              <Callout intent="danger" role="alert" compact data-testid="plan-error">
                {formError}
              </Callout>
            )}
            {amending && (
              <FormField {...field('amendmentReason')} label="Reason for the amendment" labelFor="plan-amend-reason">
                <InputGroup id="plan-amend-reason" {...withInputRef(form.register('amendmentReason'))} />
              </FormField>
            )}
            <div className="planner__actions">
              <Button
                type="submit"
                intent="primary"
                text={amending ? 'Save amendment' : 'Save plan'}
                loading={save.isPending || amend.isPending}
                disabled={hasErrors || state.sites.length === 0 || unacknowledged.length > 0}
                data-testid="save-plan"
              />
              <Link to={`/patients/${patientId}/restorations`}>Cancel</Link>
            </div>
            {hasErrors && <p className="muted">Errors block saving: fix them first.</p>}
            {!hasErrors && unacknowledged.length > 0 && <p className="muted">Acknowledge each warning to save.</p>}
          </aside>
        </form>
      </FormProvider>
    </div>
  );
}
