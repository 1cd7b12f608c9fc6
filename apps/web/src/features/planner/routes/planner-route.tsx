import '../components/planner.css';
import { Button, Callout, Checkbox, FormGroup, HTMLSelect, InputGroup, TextArea } from '@blueprintjs/core';
import { type CatalogueComponent, type CatalogueReply, type Material, PlanBody, type RestorableSite, type RestorationDetail, type RestorationKind, type Retention, findingField } from '@torquetrail/contracts';
import { formatTooth } from '@torquetrail/domain';
import { type FormEvent, useMemo, useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { isApiError } from '../../../lib/api-client';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { fieldsFromIssues } from '../../../lib/form-errors';
import { useToothSystem } from '../../../lib/tooth-system';
import { useCatalogue } from '../../catalogue';
import { useAmendPlan, useRestorableSites, useRestorations, useSavePlan } from '../api/planner-api';
import { FindingsPanel } from '../components/findings-panel';
import { emptySitePlan, initialPlan, liveFindings, type PlanState, stateFromRestoration, toBody } from '../components/plan-state';
import { SitePlanFields } from '../components/site-plan-fields';
import { DivergenceTable } from '../components/divergence-table';
import { MATERIAL_LABEL, RESTORATION_KIND_LABEL as KIND_LABEL, RETENTION_LABEL } from '../../../lib/clinical-labels';
import { usePatient } from '../../patients';

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

  if (sites.isPending || catalogue.isPending || (amendId && restorations.isPending)) return <LoadingState label="Loading the planner" />;
  if (sites.isError || catalogue.isError) return <ErrorState title="Could not load the planner" error={sites.error ?? catalogue.error} onRetry={() => { void sites.refetch(); void catalogue.refetch(); }} />;
  const amending = amendId ? restorations.data?.items.find((r) => r.id === amendId && r.status === 'planned' && !r.supersededById) : undefined;
  if (amendId && !amending) {
    return (
      <Callout intent="warning" title="This plan cannot be amended">
        It was delivered or amended already: amend its current version. <Link to={`/patients/${patientId}/restorations`}>Back to the restorations</Link>
      </Callout>
    );
  }
  return <PlannerForm key={amendId ?? 'new'} patientId={patientId} patientName={patientName} restorable={sites.data.items} catalogue={catalogue.data} amending={amending} />;
}

function PlannerForm({ patientId, patientName, restorable: all, catalogue, amending }: { patientId: string; patientName: string; restorable: RestorableSite[]; catalogue: CatalogueReply; amending?: RestorationDetail }) {
  const navigate = useNavigate();
  const [system] = useToothSystem();
  const save = useSavePlan();
  const amend = useAmendPlan();
  const [state, setState] = useState<PlanState>(() => (amending ? stateFromRestoration(amending) : initialPlan));
  const [amendmentReason, setAmendmentReason] = useState('');
  const [serverFields, setServerFields] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const parts = useMemo(() => {
    const map = new Map<string, CatalogueComponent>();
    for (const s of catalogue.systems) for (const p of s.platforms) for (const c of p.components) map.set(c.id, c);
    return map;
  }, [catalogue]);

  const restorable = all.filter((s) => s.platformId && s.status !== 'failed' && s.status !== 'removed');
  const chosen = state.sites.map((p) => restorable.find((s) => s.siteId === p.siteId)!);
  const { findings, invalid } = chosen.length > 0 ? liveFindings(state, restorable, parts) : { findings: [], invalid: {} };
  const fdis = chosen.map((s) => s.fdi);
  const findingFields: Record<string, string> = {};
  for (const f of findings) if (f.severity === 'error') findingFields[findingField(f, fdis)] ??= f.message;
  const errors = { ...serverFields, ...invalid, ...findingFields };
  const hasErrors = findings.some((f) => f.severity === 'error') || Object.keys(invalid).length > 0;
  const unacknowledged = findings.filter((f) => f.severity === 'warning' && !state.acknowledged.includes(`${f.code}:${f.fdi ?? ''}`));

  const update = (patch: Partial<PlanState>) => {
    setState((s) => ({ ...s, ...patch }));
    setServerFields({});
  };
  const toggleSite = (siteId: string, on: boolean) =>
    update({ sites: on ? [...state.sites, emptySitePlan(siteId)].sort((a, b) => restorable.findIndex((s) => s.siteId === a.siteId) - restorable.findIndex((s) => s.siteId === b.siteId)) : state.sites.filter((s) => s.siteId !== siteId) });

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    const body = toBody(patientId, { ...state, acknowledged: state.acknowledged.filter((k) => findings.some((f) => `${f.code}:${f.fdi ?? ''}` === k)) }, parts);
    const parsed = PlanBody.safeParse(body);
    if (!parsed.success) return setServerFields(fieldsFromIssues(parsed.error.issues));
    try {
      if (amending) {
        const { patientId: _p, ...rest } = body;
        await amend.mutateAsync({ id: amending.id, body: { ...rest, amendmentReason } });
      } else await save.mutateAsync(body);
      navigate(`/patients/${patientId}/restorations`);
    } catch (error) {
      if (isApiError(error)) {
        setServerFields(error.fields);
        setFormError(error.message);
      }
    }
  };
  const err = (key: string) => (errors[key] ? { intent: 'danger' as const, helperText: errors[key] } : {});

  return (
    <div className="planner-page">
      <title>Restoration planner · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Patients', to: '/patients' }, { text: patientName, to: `/patients/${patientId}` }, { text: 'Restorations', to: `/patients/${patientId}/restorations` }, { text: 'New plan' }]} />
      <h1>{amending ? 'Amend the plan' : 'Restoration planner'}</h1>
      {amending && <Callout intent="primary" compact>The saved plan stays in the record, marked as amended; this saves a new version.</Callout>}
      <form onSubmit={submit} className="planner" noValidate aria-label="Restoration plan">
        <div className="planner__main">
          <fieldset className="planner-sites" data-testid="planner-sites">
            <legend>Sites</legend>
            {restorable.length === 0 && <Callout intent="primary">This patient has no placed implant to restore.</Callout>}
            {restorable.map((s) => (
              <Checkbox key={s.siteId} inline label={`${formatTooth(s.fdi, system)} (${s.platformName})`} checked={state.sites.some((p) => p.siteId === s.siteId)} onChange={(e) => toggleSite(s.siteId, e.currentTarget.checked)} />
            ))}
            {errors.sites && <p className="planner-error" role="alert" data-testid="error-sites">{errors.sites}</p>}
          </fieldset>
          <div className="planner-grid">
            <FormGroup label="Restoration" labelFor="plan-kind">
              <HTMLSelect id="plan-kind" value={state.kind} onChange={(e) => update({ kind: e.currentTarget.value as RestorationKind })}>
                {Object.entries(KIND_LABEL).map(([v, t]) => <option key={v} value={v}>{t}</option>)}
              </HTMLSelect>
            </FormGroup>
            <FormGroup label="Retention" labelFor="plan-retention">
              <HTMLSelect id="plan-retention" value={state.retention} onChange={(e) => update({ retention: e.currentTarget.value as Retention })}>
                {Object.entries(RETENTION_LABEL).map(([v, t]) => <option key={v} value={v}>{t}</option>)}
              </HTMLSelect>
            </FormGroup>
            <FormGroup label="Material" labelFor="plan-material">
              <HTMLSelect id="plan-material" value={state.material} onChange={(e) => update({ material: e.currentTarget.value as Material })}>
                {Object.entries(MATERIAL_LABEL).map(([v, t]) => <option key={v} value={v}>{t}</option>)}
              </HTMLSelect>
            </FormGroup>
            <FormGroup label="Shade" labelFor="plan-shade" {...err('shade')}>
              <InputGroup id="plan-shade" value={state.shade} onValueChange={(v) => update({ shade: v })} />
            </FormGroup>
          </div>
          <FormGroup {...err('copingsSplinted')}>
            <Checkbox label="Impression copings splinted together before the impression" checked={state.copingsSplinted} onChange={(e) => update({ copingsSplinted: e.currentTarget.checked })} />
          </FormGroup>
          {state.sites.map((p, i) => (
            <SitePlanFields
              key={p.siteId}
              index={i}
              site={chosen[i]!}
              plan={p}
              retention={state.retention}
              parts={[...parts.values()].filter((c) => c.platformId === chosen[i]!.platformId)}
              system={system}
              errors={errors}
              onChange={(next) => update({ sites: state.sites.map((x, j) => (j === i ? next : x)) })}
            />
          ))}
          <div className="planner-grid">
            <FormGroup label="Laboratory" labelFor="plan-lab" {...err('labName')}>
              <InputGroup id="plan-lab" value={state.labName} onValueChange={(v) => update({ labName: v })} />
            </FormGroup>
            <FormGroup label="Laboratory e-mail" labelFor="plan-lab-email" {...err('labEmail')}>
              <InputGroup id="plan-lab-email" type="email" value={state.labEmail} onValueChange={(v) => update({ labEmail: v })} />
            </FormGroup>
            <FormGroup label="Due date" labelFor="plan-due" {...err('dueOn')}>
              <InputGroup id="plan-due" type="date" value={state.dueOn} onValueChange={(v) => update({ dueOn: v })} />
            </FormGroup>
          </div>
          <FormGroup label="Notes for the laboratory" labelFor="plan-notes" {...err('notes')}>
            <TextArea id="plan-notes" value={state.notes} onChange={(e) => update({ notes: e.currentTarget.value })} fill />
          </FormGroup>
        </div>
        <aside className="planner__side">
          <FindingsPanel findings={findings} acknowledged={state.acknowledged} onAcknowledge={(k, on) => update({ acknowledged: on ? [...state.acknowledged, k] : state.acknowledged.filter((x) => x !== k) })} />
          <DivergenceTable
            system={system}
            axes={state.sites.map((p, i) => {
              const typed = p.axis.every((v) => v.trim() !== '') ? (p.axis.map(Number) as [number, number, number]) : null;
              return { fdi: chosen[i]!.fdi, axis: typed ?? chosen[i]!.axis };
            })}
          />
          <Callout intent="warning" icon="info-sign" compact className="planner-caution">{catalogue.caution}</Callout>
          {formError && <Callout intent="danger" role="alert" compact data-testid="plan-error">{formError}</Callout>}
          {amending && (
            <FormGroup label="Reason for the amendment" labelFor="plan-amend-reason" {...err('amendmentReason')}>
              <InputGroup id="plan-amend-reason" value={amendmentReason} onValueChange={setAmendmentReason} />
            </FormGroup>
          )}
          <div className="planner__actions">
            <Button type="submit" intent="primary" text={amending ? 'Save amendment' : 'Save plan'} loading={save.isPending || amend.isPending} disabled={hasErrors || state.sites.length === 0 || unacknowledged.length > 0} data-testid="save-plan" />
            <Link to={`/patients/${patientId}/restorations`}>Cancel</Link>
          </div>
          {hasErrors && <p className="muted">Errors block saving: fix them first.</p>}
          {!hasErrors && unacknowledged.length > 0 && <p className="muted">Acknowledge each warning to save.</p>}
        </aside>
      </form>
    </div>
  );
}
